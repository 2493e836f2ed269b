import type { InstrumentKind } from "@/db/schema";

export type { InstrumentKind };

/** The kinds the register holds, in the order the lab thinks of them (the migration's check lists the same). */
export const INSTRUMENT_KINDS = [
  "cycler-channel",
  "thermometer",
  "climate-chamber",
  "balance",
  "resistance-meter",
] as const satisfies readonly InstrumentKind[];

export const INSTRUMENT_KIND_LABELS: Record<InstrumentKind, string> = {
  "cycler-channel": "cycler channel",
  thermometer: "thermometer",
  "climate-chamber": "climate chamber",
  balance: "balance",
  "resistance-meter": "resistance meter",
};
