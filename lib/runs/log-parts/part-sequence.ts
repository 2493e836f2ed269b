import { readNumber, readTimestamp, type ColumnMapping } from "@/lib/analysis/log-import";

/**
 * How a log part fits after the run's earlier parts. Pure: the worker calls it with the part it has just
 * read and the last accepted part, under the run's lock, and refuses the part (nothing stored) when it does not fit.
 */

/** Where a part lies in the run's time base: Unix seconds for timestamped logs, the cycler's elapsed seconds otherwise. */
export interface PartSpan {
  number: number;
  firstS: number;
  lastS: number;
  samples: number;
  /** Column names of the header row, as written. */
  header: readonly string[];
}

export type PartFit = { ok: true; gapS: number | null } | { ok: false; problem: string };

/** A pause longer than this many mean sample intervals of the earlier part, and at least a minute, is a gap (our own threshold). */
export const GAP_INTERVALS = 10;
export const GAP_MIN_S = 60;

const secondsPerUnit = { s: 1, min: 60, h: 3600 } as const;

/** The part's first time cell in the run's time base, or NaN when it cannot be read. */
export function readPartStart(firstTime: string, mapping: ColumnMapping): number {
  if (mapping.time.form === "timestamp") return readTimestamp(firstTime) / 1000;
  return readNumber(firstTime, mapping.decimalSeparator === ",") * secondsPerUnit[mapping.time.unit];
}

/** Checks a part against the one accepted before it (null for the first part of a log). */
export function checkNextPart(previous: PartSpan | null, next: Omit<PartSpan, "number">, form: ColumnMapping["time"]["form"]): PartFit {
  if (!Number.isFinite(next.firstS) || !Number.isFinite(next.lastS)) return { ok: false, problem: "The part's first time cannot be read, so it cannot be placed after the earlier parts." };
  if (!previous) return { ok: true, gapS: null };
  const number = previous.number + 1;
  if (!sameColumns(previous.header, next.header)) {
    return {
      ok: false,
      problem: `Part ${number} has the columns ${listColumns(next.header)}, but the earlier parts of this run have ${listColumns(previous.header)}. Send the part as the cycler wrote the earlier ones.`,
    };
  }
  if (next.firstS < previous.firstS) {
    return {
      ok: false,
      problem: `Time goes backwards: this part starts at ${formatPartTime(next.firstS, form)}, before part ${previous.number} started (${formatPartTime(previous.firstS, form)}). Parts must be sent in the order they were logged.`,
    };
  }
  if (next.firstS <= previous.lastS) {
    return {
      ok: false,
      problem: `This part overlaps part ${previous.number}: it starts at ${formatPartTime(next.firstS, form)}, but part ${previous.number} runs until ${formatPartTime(previous.lastS, form)}. Send only the samples logged after the earlier part.`,
    };
  }
  const pause = next.firstS - previous.lastS;
  const interval = previous.samples > 1 ? (previous.lastS - previous.firstS) / (previous.samples - 1) : 0;
  return { ok: true, gapS: pause > Math.max(GAP_MIN_S, GAP_INTERVALS * interval) ? pause : null };
}

function sameColumns(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((name, i) => name === b[i]);
}

function listColumns(header: readonly string[]): string {
  return header.map((h) => `"${h}"`).join(", ");
}

/** A time in the run's base, in words: a UTC date and time for timestamped logs, the elapsed time otherwise. */
export function formatPartTime(s: number, form: ColumnMapping["time"]["form"]): string {
  if (form === "timestamp") return `${new Date(s * 1000).toISOString().slice(0, 19).replace("T", " ")} UTC`;
  return `${describeDuration(s)} elapsed`;
}

/** A length of time as a person writes it: "2 h 05 min", "45 s". */
export function describeDuration(s: number): string {
  const total = Math.round(s);
  const d = Math.floor(total / 86400);
  const h = Math.floor((total % 86400) / 3600);
  const m = Math.floor((total % 3600) / 60);
  const sec = total % 60;
  if (d > 0) return `${d} d ${h} h ${String(m).padStart(2, "0")} min`;
  if (h > 0) return `${h} h ${String(m).padStart(2, "0")} min`;
  if (m > 0) return `${m} min ${String(sec).padStart(2, "0")} s`;
  return `${sec} s`;
}
