import "server-only";
import { queueCalibrationReminders } from "./calibration-reminders";
import { sendPendingMail } from "./send-pending-mail";

// Sending happens after the change has committed, in the background of each app process:
// kickMailDispatch() right after a commit for a prompt message, and a loop that picks up what is
// due (retries, and messages another process queued) every 30 s and the calibration reminders hourly.
// Several processes may do this at once; the outbox's claim (SKIP LOCKED) keeps each message to one.
// Only a process whose loop runs sends: a short-lived script (the demo seed) that queues mail leaves
// it to the app, rather than exiting in the middle of a send.

const DEFAULT_INTERVAL_MS = 30_000;
const REMINDER_INTERVAL_MS = 60 * 60_000;
const BATCH = 20;

interface DispatchState {
  running: Promise<void> | null;
  again: boolean;
  loop: ReturnType<typeof setInterval> | null;
  firstTick: ReturnType<typeof setTimeout> | null;
  tickBusy: boolean;
  lastReminderAt: number;
}

// On globalThis: Next may load this module more than once in one process (bundles, reloads in dev).
const holder = globalThis as unknown as { cellwrightMailDispatch?: DispatchState };
const state: DispatchState = (holder.cellwrightMailDispatch ??= {
  running: null,
  again: false,
  loop: null,
  firstTick: null,
  tickBusy: false,
  lastReminderAt: 0,
});

/**
 * Sends what is due, in the background, without waiting and without ever throwing: the caller's change
 * has committed and stays committed whatever happens to the mail. Kicks during a pass run one more pass.
 * Outside a process whose mail loop runs it does nothing; the app's next pass sends the message.
 */
export function kickMailDispatch(): void {
  try {
    if (!state.loop) return;
    if (state.running) {
      state.again = true;
      return;
    }
    state.running = (async () => {
      let fullBatch: boolean;
      do {
        state.again = false;
        const { sent, failed } = await sendPendingMail({ limit: BATCH });
        fullBatch = sent + failed === BATCH;
      } while (state.again || fullBatch);
    })()
      .catch((error: unknown) => console.error("mail: sending the outbox failed; it is tried again shortly:", error))
      .finally(() => {
        state.running = null;
      });
  } catch (error) {
    console.error("mail: could not start sending the outbox:", error);
  }
}

/** Resolves once no background pass is running (for tests and an orderly shutdown). */
export async function waitForMailDispatch(): Promise<void> {
  while (state.running) await state.running;
}

/** Starts this process's mail loop once; later calls do nothing. Interval from MAIL_DISPATCH_INTERVAL_MS. */
export function startMailDispatchLoop(): void {
  if (state.loop) return;
  const configured = Number(process.env.MAIL_DISPATCH_INTERVAL_MS);
  const intervalMs = Number.isFinite(configured) && configured >= 500 ? configured : DEFAULT_INTERVAL_MS;
  if (!process.env.SMTP_HOST?.trim()) {
    console.warn("mail: SMTP_HOST is not set, so no e-mail is sent; messages wait in the outbox until it is.");
  }
  state.loop = setInterval(() => void runLoopTick(), intervalMs);
  state.loop.unref();
  // The first pass soon after start: messages left by a previous process go out without waiting a full interval.
  state.firstTick = setTimeout(() => void runLoopTick(), Math.min(intervalMs, 5_000));
  state.firstTick.unref();
}

/** Stops this process's mail loop (and with it the kicks); a pass already running finishes. */
export function stopMailDispatchLoop(): void {
  if (state.loop) clearInterval(state.loop);
  if (state.firstTick) clearTimeout(state.firstTick);
  state.loop = null;
  state.firstTick = null;
}

async function runLoopTick(): Promise<void> {
  if (state.tickBusy) return;
  state.tickBusy = true;
  try {
    if (Date.now() - state.lastReminderAt >= REMINDER_INTERVAL_MS) {
      const queued = await queueCalibrationReminders(new Date());
      state.lastReminderAt = Date.now();
      if (queued > 0) console.log(`mail: queued ${queued} calibration reminder${queued === 1 ? "" : "s"}`);
    }
    kickMailDispatch();
    await waitForMailDispatch();
  } catch (error) {
    console.error("mail: the mail loop failed this time; it tries again at the next interval:", error);
  } finally {
    state.tickBusy = false;
  }
}
