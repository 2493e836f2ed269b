import type { StepRecord } from "@/lib/conformance";
import { formatNumber, type ResolvedStep } from "@/protocols";
import { formatRecordedTime } from "./format-recorded-time";
import { listProgrammedFields } from "./programmed-fields";

/** What was recorded for a line, read-only: times, ambient readings, set-points programmed, notes. */
export function StepRecordSummary({ step, record }: { step: ResolvedStep; record: StepRecord | null }) {
  if (!record) return <p className="text-sm text-ink-soft">Nothing recorded yet.</p>;
  const programmed = listProgrammedFields(step).flatMap((f) => {
    const v = record.programmed[f.name];
    return v === undefined ? [] : [`${f.label} ${formatNumber(v / f.toSi, { maxDecimals: 4 })} ${f.unit}`];
  });
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-2">
      <div>
        <dt className="inline text-ink-soft">Started: </dt>
        <dd className="figures inline">{record.startedAt ? formatRecordedTime(record.startedAt) : "not marked"}</dd>
      </div>
      <div>
        <dt className="inline text-ink-soft">Ended: </dt>
        <dd className="figures inline">{record.endedAt ? formatRecordedTime(record.endedAt) : "not marked"}</dd>
      </div>
      <div className="sm:col-span-2">
        <dt className="inline text-ink-soft">Ambient: </dt>
        <dd className="figures inline">
          {record.ambientReadings.length === 0
            ? "no reading"
            : record.ambientReadings
                .map((r) => `${formatNumber(r.celsius, { maxDecimals: 2 })} °C${r.instrumentId ? ` (${r.instrumentId})` : ""}`)
                .join(", ")}
        </dd>
      </div>
      {programmed.length > 0 && (
        <div className="sm:col-span-2">
          <dt className="inline text-ink-soft">Programmed: </dt>
          <dd className="figures inline">{programmed.join(" · ")}</dd>
        </div>
      )}
      {record.notes && (
        <div className="sm:col-span-2">
          <dt className="inline text-ink-soft">Notes: </dt>
          <dd className="inline whitespace-pre-line">{record.notes}</dd>
        </div>
      )}
    </dl>
  );
}
