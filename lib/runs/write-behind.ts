/**
 * Writes items one after another in the background while the caller keeps producing them (the parser
 * reading on while the database stores the previous chunk). `add` never waits; `keepUp` waits only when
 * more than `maxQueued` items are not yet written, and lets pending I/O run (a parser loop that never
 * yields to the event loop would otherwise hold every write back until it ends). The first failure is
 * kept and thrown by `keepUp`/`finish`; later items are then skipped.
 */
export interface WriteBehind<T> {
  add(item: T): void;
  keepUp(): Promise<void>;
  finish(): Promise<void>;
}

export function createWriteBehind<T>(write: (item: T) => Promise<void>, maxQueued = 2): WriteBehind<T> {
  let chain: Promise<void> = Promise.resolve();
  const queued: Promise<void>[] = [];
  let failure: { error: unknown } | null = null;

  function add(item: T): void {
    chain = chain.then(async () => {
      if (failure) return;
      try {
        await write(item);
      } catch (error) {
        failure ??= { error };
      }
    });
    queued.push(chain);
  }

  async function keepUp(): Promise<void> {
    await new Promise<void>((resolve) => setImmediate(resolve));
    while (queued.length > maxQueued) await queued.shift();
    if (failure) throw failure.error;
  }

  async function finish(): Promise<void> {
    await chain;
    queued.length = 0;
    if (failure) throw failure.error;
  }

  return { add, keepUp, finish };
}
