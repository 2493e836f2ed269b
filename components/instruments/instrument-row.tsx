import { Cell, Row } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
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
    <Row data-testid={`instrument-${i.identifier}`} top>
      <Cell>
        <div className="flex flex-col items-start gap-1">
          {i.active ? <CalibrationBadge status={i.status} /> : <OutOfUseBadge />}
          <span className="text-xs text-ink-soft">{describeDaysLeft(i)}</span>
        </div>
      </Cell>
      <Cell>
        <span className="font-medium">{i.identifier}</span>
        <br />
        <span className="text-ink-soft">
          {INSTRUMENT_KIND_LABELS[i.kind]} · serial {i.serial}
          {i.firmware ? ` · firmware ${i.firmware}` : ""}
        </span>
      </Cell>
      <Cell>
        <AccuracyList accuracy={i.accuracy} />
      </Cell>
      <Cell>
        <span className="font-mono text-xs">{i.calibrationCertificate}</span>
        <br />
        <span className="whitespace-nowrap">{i.calibratedOn}</span>
      </Cell>
      <Cell className="whitespace-nowrap">{i.dueOn}</Cell>
      {inUseAction && (
        <Cell>
          <div className="flex flex-col items-start gap-2">
            <TextLink href={`/instruments/${i.id}/edit`} aria-label={`Edit ${i.identifier}`}>
              Edit
            </TextLink>
            <InstrumentInUseControl action={inUseAction} id={i.id} identifier={i.identifier} active={i.active} />
          </div>
        </Cell>
      )}
    </Row>
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
