import Link from "next/link";
import type { InstrumentView } from "@/db/instruments";
import type { ActionState } from "@/lib/forms/action-state";
import { DUE_SOON_DAYS } from "@/lib/instruments/calibration-status";
import { describeAccuracy } from "@/lib/instruments/describe-accuracy";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/instrument-kind";
import type { Ranked } from "@/lib/instruments/rank-instruments";
import { CalibrationBadge, OutOfUseBadge } from "./calibration-badge";
import { InstrumentInUseControl } from "./instrument-in-use-control";

type RankedInstrument = Ranked<InstrumentView>;
type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/** One instrument of the register; `inUseAction` (admins only) adds the controls to change it. */
export function InstrumentRow({ instrument: i, inUseAction }: { instrument: RankedInstrument; inUseAction: Action | null }) {
  return (
    <tr className="border-b border-rule align-top" data-testid={`instrument-${i.identifier}`}>
      <td className="py-2 pr-3">
        <div className="flex flex-col items-start gap-1">
          {i.active ? <CalibrationBadge status={i.status} /> : <OutOfUseBadge />}
          <span className="text-xs text-ink-soft">{describeDaysLeft(i)}</span>
        </div>
      </td>
      <td className="py-2 pr-3">
        <span className="font-medium">{i.identifier}</span>
        <br />
        <span className="text-ink-soft">
          {INSTRUMENT_KIND_LABELS[i.kind]} · serial {i.serial}
          {i.firmware ? ` · firmware ${i.firmware}` : ""}
        </span>
      </td>
      <td className="py-2 pr-3">
        <AccuracyList accuracy={i.accuracy} />
      </td>
      <td className="py-2 pr-3">
        <span className="font-mono text-xs">{i.calibrationCertificate}</span>
        <br />
        <span className="whitespace-nowrap">{i.calibratedOn}</span>
      </td>
      <td className="py-2 pr-3 whitespace-nowrap">{i.dueOn}</td>
      {inUseAction && (
        <td className="py-2">
          <div className="flex flex-col items-start gap-2">
            <Link href={`/instruments/${i.id}/edit`} className="text-copper-deep underline" aria-label={`Edit ${i.identifier}`}>
              Edit
            </Link>
            <InstrumentInUseControl action={inUseAction} id={i.id} identifier={i.identifier} active={i.active} />
          </div>
        </td>
      )}
    </tr>
  );
}

function AccuracyList({ accuracy }: { accuracy: InstrumentView["accuracy"] }) {
  const parts = describeAccuracy(accuracy);
  if (parts.length === 0) return <span className="text-ink-soft">not stated</span>;
  return (
    <ul>
      {parts.map((p) => (
        <li key={p.quantity}>{p.text}</li>
      ))}
    </ul>
  );
}

function describeDaysLeft(i: RankedInstrument): string {
  const days = Math.abs(i.daysLeft);
  const count = `${days} ${days === 1 ? "day" : "days"}`;
  switch (i.status) {
    case "overdue":
      return `${count} overdue`;
    case "due soon":
      return i.daysLeft === 0 ? `falls due within ${DUE_SOON_DAYS} days: today is the last day` : `falls due within ${DUE_SOON_DAYS} days: in ${count}`;
    case "valid":
      return `due in ${count}`;
    default: {
      const unknown: never = i.status;
      throw new Error(`Unknown status ${String(unknown)}`);
    }
  }
}
