import { describeObservedValues, type StepCorrection, type StepRecord } from "@/lib/conformance";
import { OBSERVATION_FIELDS } from "./observation-form";
import { formatNumber, type ResolvedStep } from "@/protocols";
import { formatRecordedTime } from "./format-recorded-time";
import { listProgrammedFields, type ProgrammedFieldSpec } from "./programmed-fields";

function describeCorrected(correction: StepCorrection, fields: ProgrammedFieldSpec[]): { what: string; was: string } {
  if (correction.field === "startedAt" || correction.field === "endedAt") {
    return { what: correction.field === "startedAt" ? "start" : "end", was: typeof correction.was === "string" ? formatRecordedTime(correction.was) : "not marked" };
  }
  const observed = OBSERVATION_FIELDS.find((f) => `observed.${f.name}` === correction.field);
  if (observed) return { what: observed.label.toLowerCase(), was: typeof correction.was === "number" ? `${formatNumber(correction.was, { maxDecimals: 4 })} ${observed.unit}` : "not recorded" };
  if (correction.field === "observed.visual") return { what: "visual state", was: `none seen: ${String(correction.was)}` };
  const spec = fields.find((f) => `programmed.${f.name}` === correction.field);
  if (!spec) return { what: "a set-point", was: String(correction.was ?? "not recorded") };
  const was = typeof correction.was === "number" ? `${formatNumber(correction.was / spec.toSi, { maxDecimals: 4 })} ${spec.unit}` : "not recorded";
  return { what: spec.label.toLowerCase(), was };
}

/**
 * What was recorded for a line, read-only: times, ambient readings, set-points programmed, notes.
 * Struck readings and replaced values stay visible, struck through, with who, when and why.
 */
export function StepRecordSummary({ step, record }: { step: ResolvedStep; record: StepRecord | null }) {
  if (!record) return <p className="text-sm text-ink-soft">Nothing recorded yet.</p>;
  const fields = listProgrammedFields(step);
  const programmed = fields.flatMap((f) => {
    const v = record.programmed[f.name];
    return v === undefined ? [] : [`${f.label} ${formatNumber(v / f.toSi, { maxDecimals: 4 })} ${f.unit}`];
  });
  const corrections = record.corrections ?? [];
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
        <dd className="figures inline" data-testid="recorded-ambient">
          {record.ambientReadings.length === 0
            ? "no reading"
            : record.ambientReadings.map((r, i) => {
                const text = `${formatNumber(r.celsius, { maxDecimals: 2 })} °C${r.instrumentId ? ` (${r.instrumentId})` : ""}`;
                return (
                  <span key={i}>
                    {i > 0 && ", "}
                    {r.struck ? (
                      <>
                        <s data-testid="struck-reading">{text}</s>{" "}
                        <span className="text-ink-soft">
                          [struck by {r.struck.by} at {formatRecordedTime(r.struck.at)}: {r.struck.reason}]
                        </span>
                      </>
                    ) : (
                      text
                    )}
                    {r.note && <span className="text-ink-soft"> [note: {r.note}]</span>}
                    {r.backdatedReason && <span className="text-ink-soft"> [taken {formatRecordedTime(r.at)}, entered late: {r.backdatedReason}]</span>}
                  </span>
                );
              })}
        </dd>
      </div>
      {programmed.length > 0 && (
        <div className="sm:col-span-2">
          <dt className="inline text-ink-soft">Programmed: </dt>
          <dd className="figures inline">{programmed.join(" · ")}</dd>
        </div>
      )}
      {describeObservedValues(record.observed ?? null).map((row) => (
        <div key={row.name} className="sm:col-span-2">
          <dt className="inline text-ink-soft">{row.name}: </dt>
          <dd className="figures inline">{row.value}</dd>
        </div>
      ))}
      {corrections.length > 0 && (
        <div className="sm:col-span-2">
          <dt className="text-ink-soft">Corrected:</dt>
          <dd>
            <ul className="list-disc pl-5" data-testid="corrections">
              {corrections.map((c, i) => {
                const { what, was } = describeCorrected(c, fields);
                return (
                  <li key={i}>
                    {what}: <s>{was}</s> replaced by {c.by} at {formatRecordedTime(c.at)}: {c.reason}
                  </li>
                );
              })}
            </ul>
          </dd>
        </div>
      )}
      {record.cautionsAcknowledged && (
        <div className="sm:col-span-2">
          <dt className="inline text-ink-soft">Cautions: </dt>
          <dd className="inline">
            read and acknowledged by {record.cautionsAcknowledged.by} at {formatRecordedTime(record.cautionsAcknowledged.at)}, before the step started
          </dd>
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
