import { View } from "@react-pdf/renderer";
import type { ConformityOutcome } from "@/lib/conformance";
import { explainDecisionRule, formatNumber, nameDecisionRule, type StoredDecisionRule } from "@/protocols";
import {
  formatCelsius,
  formatCelsiusRange,
  formatDuration,
  formatFigure,
  formatMah,
  formatMilliohm,
  formatMoment,
  formatVolts,
  formatWh,
  withUnit,
} from "./certificate-format";
import { OutcomeMark, VqPlot, type OutcomeTone } from "./certificate-figures";
import type { CertificateCell, CertificateCommon, CertificateFinding, CertificateStepResult, RunCertificatePayload } from "./certificate-payload";
import { Field, Heading, ink, outcomeColour, rule, styles, Table, Tx } from "./certificate-primitives";
import type { DischargeCurve } from "./vq-plot";

type P = { payload: RunCertificatePayload };

export function toneOfConformity(outcome: ConformityOutcome): OutcomeTone {
  return outcome === "conforms" ? "meets" : outcome === "does not conform" || outcome === "conditional fail" ? "deviates" : "open";
}

/** The outcome's words with a capital, as a headline writes them. */
export function capitaliseOutcome(outcome: string): string {
  return `${outcome.charAt(0).toUpperCase()}${outcome.slice(1)}`;
}

export function OutcomeLine({ tone, words, rest, large }: { tone: OutcomeTone; words: string; rest: string; large?: boolean }) {
  return (
    <View style={{ flexDirection: "row", alignItems: "center", marginBottom: 3 }} wrap={false}>
      <OutcomeMark tone={tone} size={large ? 12 : 9} />
      <Tx style={{ marginLeft: 5, fontSize: large ? 12 : 8.5, flex: 1 }}>
        <Tx style={{ fontWeight: 700, color: outcomeColour[tone] }}>{words}</Tx>
        {rest}
      </Tx>
    </View>
  );
}

const PROCEDURE_WORDS = { yes: "yes", no: "no", "not decided": "not decided" } as const;

export function TitleBlock({ payload }: P) {
  const c = payload.conformity;
  const rule_ = c.decisionRule;
  const followed =
    c.procedureFollowed === "yes"
      ? ` — all ${payload.checks.total} checks of the records and the data log meet.`
      : c.procedureFollowed === "no"
        ? ` — ${payload.checks.deviates} of ${payload.checks.total} checks ${payload.checks.deviates === 1 ? "deviates; it is" : "deviate; each is"} stated in section 9 with the reviewer's note.`
        : ` — ${payload.checks.notAssessable} of ${payload.checks.total} checks could not be assessed, none deviates (section 9).`;
  return (
    <View>
      <Tx style={{ fontSize: 20, fontWeight: 700, lineHeight: 1.2 }}>{payload.title}</Tx>
      <Tx style={{ fontSize: 10, marginTop: 4 }}>
        {`No. ${payload.number}   ·   issued ${formatMoment(payload.issuedAt)}   ·   run ${payload.run.number}`}
      </Tx>
      {payload.replaces && (
        <View style={{ marginTop: 8, padding: 6, borderWidth: 0.8, borderColor: ink, borderStyle: "solid" }} wrap={false}>
          <Tx style={styles.strong}>{`Amendment: this certificate replaces certificate ${payload.replaces.number}, which is withdrawn.`}</Tx>
          <Tx>{`Reason: ${payload.replaces.reason}`}</Tx>
        </View>
      )}
      <View style={{ marginTop: 10, paddingVertical: 6, borderTopWidth: 0.8, borderBottomWidth: 0.8, borderColor: rule }}>
        <OutcomeLine
          large
          tone={toneOfConformity(c.specimenConforms)}
          words={capitaliseOutcome(c.specimenConforms)}
          rest={` — statement of conformity of specimen ${payload.item.specimen.identifier} to the acceptance criteria of ${payload.method.code}, under the decision rule ${nameDecisionRule(rule_)} (section 7).`}
        />
        <OutcomeLine
          tone={c.procedureFollowed === "yes" ? "meets" : c.procedureFollowed === "no" ? "deviates" : "open"}
          words={`Procedure followed: ${PROCEDURE_WORDS[c.procedureFollowed]}`}
          rest={followed}
        />
        {c.beyondRating && <OutcomeLine tone="deviates" words="Outside the cell's rating" rest=" — at least one step ran beyond the cell's rated current or voltage; its results are marked so." />}
      </View>
    </View>
  );
}

export function LabSection({ payload }: { payload: CertificateCommon }) {
  return (
    <View wrap={false}>
      <Heading number={1}>Laboratory and customer</Heading>
      <Field label="Laboratory">{payload.lab.name}</Field>
      <Field label="Address">{payload.lab.address}</Field>
      {payload.lab.accreditation && <Field label="Accreditation">{payload.lab.accreditation}</Field>}
      <Field label="Place of the work">{payload.placeOfWork}</Field>
      <Field label="Customer">{payload.customer ?? "None: in-house work of the laboratory."}</Field>
    </View>
  );
}

/** The datasheet values a certificate states beside the cell. */
export function describeDatasheet(cell: CertificateCell): string {
  return `rated capacity ${formatMah(cell.ratedCapacityMah)}${cell.minimumCapacityMah !== null ? `, minimum ${formatMah(cell.minimumCapacityMah)}` : ""}, nominal ${formatVolts(cell.nominalVoltageV)}, charge ${formatVolts(cell.chargeVoltageV)}, end of discharge ${formatVolts(cell.endOfDischargeVoltageV)}`;
}

export function ItemSection({ payload }: P) {
  const { specimen, lot, cell } = payload.item;
  return (
    <View wrap={false}>
      <Heading number={2}>Item tested</Heading>
      <Field label="Specimen">{specimen.identifier}</Field>
      <Field label="Cell">{`${cell.maker} ${cell.model}, ${cell.designation}, ${cell.chemistry}`}</Field>
      <Field label="Datasheet values">{describeDatasheet(cell)}</Field>
      {lot && <Field label="Lot">{`${lot.identifier} from ${lot.supplier}, received ${lot.receivedOn}`}</Field>}
      <Field label="Date of receipt">{specimen.receivedOn}</Field>
      <Field label="Condition on receipt">{specimen.conditionOnReceipt}</Field>
      <Field label="Sampling">{payload.sampling}</Field>
    </View>
  );
}

function describeSpan(span: { from: string | null; to: string | null }): string {
  return span.from && span.to ? `${formatMoment(span.from)} to ${formatMoment(span.to)}` : "not recorded";
}

export function MethodSection({ payload }: P) {
  const m = payload.method;
  const t = payload.testing;
  return (
    <View wrap={false}>
      <Heading number={3}>Method and dates</Heading>
      <Field label="Procedure">{`${m.code} version ${m.version}: ${m.title}`}</Field>
      <Field label="Standard and clause">{`${m.standard}, ${m.clause}`}</Field>
      {m.note && <Field label="Note">{m.note}</Field>}
      <Field label="Dates of testing">{t.from && t.to ? `${formatMoment(t.from)} to ${formatMoment(t.to)}${t.source ? `, ${t.source}` : ""}` : "not recorded"}</Field>
      {t.stepSheet?.from && t.stepSheet.to && describeSpan(t.stepSheet) !== describeSpan(t) && (
        <Field label="Step sheet">{`${describeSpan(t.stepSheet)}: the times the operator recorded, which differ from the data log's`}</Field>
      )}
      <Field label="Date of issue">{formatMoment(payload.issuedAt)}</Field>
    </View>
  );
}

const outcomeWords = (o: string | null) => o ?? "not checked";

export function ConditionsSection({ payload }: P) {
  return (
    <View>
      <Table
        lead={<Heading number={4}>Test conditions: ambient temperature</Heading>}
        columns={[
          { title: "Step", width: 30 },
          { title: "Required", width: 22 },
          { title: "Recorded", width: 26 },
          { title: "Mean", width: 10, align: "right" },
          { title: "Outcome", width: 12 },
        ]}
        rows={payload.conditions.map((a) => [
          a.label,
          formatCelsiusRange(a.requiredMinC, a.requiredMaxC),
          a.minC !== null && a.maxC !== null ? `${formatCelsiusRange(a.minC, a.maxC)} (${a.readings} reading${a.readings === 1 ? "" : "s"})` : "no reading",
          a.meanC !== null ? formatCelsius(a.meanC) : "–",
          outcomeWords(a.outcome),
        ])}
      />
    </View>
  );
}

export function InstrumentsSection({ payload }: P) {
  return (
    <View>
      {payload.instruments.length === 0 ? (
        <View wrap={false}>
          <Heading number={5}>Instruments and their calibration</Heading>
          <Tx>No instrument was recorded for this run.</Tx>
        </View>
      ) : (
        <Table
          lead={<Heading number={5}>Instruments and their calibration</Heading>}
          columns={[
            { title: "Instrument", width: 16 },
            { title: "Kind", width: 15 },
            { title: "Serial", width: 12 },
            { title: "Calibration certificate", width: 19 },
            { title: "Calibrated", width: 12 },
            { title: "Due", width: 12 },
            { title: "Covers testing", width: 14 },
          ]}
          rows={payload.instruments.map((i) => [
            i.identifier,
            i.kind.replace(/-/g, " "),
            i.serial,
            i.calibrationCertificate,
            i.calibratedOn,
            i.dueOn,
            i.calibratedForTesting ? "yes" : "NO: outside the calibration period",
          ])}
        />
      )}
    </View>
  );
}

/** "set-point 0.600 A = 0.2 It, as programmed" under a step's name (It = Cn / 1 h, IEC 61434). */
export function describeSetPoints(setPoints: CertificateStepResult["setPoints"]): string {
  if (!setPoints || setPoints.length === 0) return "";
  const parts = setPoints.map((s) => `${s.name === "current" ? "set-point" : s.name} ${withUnit(s.currentA, 3, "A")} = ${formatNumber(s.itMultiple, { maxDecimals: 3 })} It`);
  const from = [...new Set(setPoints.map((s) => s.from))].join(" / ");
  return `\n${parts.join("; ")}, ${from}`;
}

export function ResultsSection({ payload, curves }: P & { curves: DischargeCurve[] }) {
  const withResistance = payload.results.some((r) => r.dcResistanceOhm !== null);
  const columns = [
    { title: "Step", width: withResistance ? 22 : 26 },
    { title: "Duration", width: 12, align: "right" as const },
    { title: "Capacity", width: 12, align: "right" as const },
    { title: "Energy", width: 11, align: "right" as const },
    { title: "Mean voltage", width: 12, align: "right" as const },
    { title: "End voltage", width: 12, align: "right" as const },
    { title: "Highest temp.", width: withResistance ? 9 : 15, align: "right" as const },
    ...(withResistance ? [{ title: "DC resistance", width: 10, align: "right" as const }] : []),
  ];
  // A run of observations alone has no logged step: its results are the observations.
  if (payload.results.length === 0 && payload.observations && !payload.endurance) {
    return (
      <View>
        <Heading number={6}>Results</Heading>
        <Tx style={{ ...styles.small, marginBottom: 3 }}>No step of this procedure is logged by a cycler; the results are the observations recorded on the step sheet.</Tx>
        <ObservationsTables observations={payload.observations} />
      </View>
    );
  }
  // An endurance run's results are its cycles.
  if (payload.results.length === 0 && payload.endurance) {
    return (
      <View>
        <Heading number={6}>Results</Heading>
        <EnduranceTables endurance={payload.endurance} />
        {payload.observations && <ObservationsTables observations={payload.observations} />}
      </View>
    );
  }
  return (
    <View>
      <Table
        lead={
          <>
            <Heading number={6}>Results</Heading>
            <Tx style={{ ...styles.small, marginBottom: 3 }}>
              Capacity Q = integral of |I| dt and energy E = integral of U·|I| dt over each step, trapezoid rule on the stored log; mean voltage = E / Q.
            </Tx>
          </>
        }
        columns={columns}
        rows={payload.results.map((r) => [
          `${r.label}${r.beyondRating ? " (outside rating)" : ""}${describeSetPoints(r.setPoints)}`,
          formatDuration(r.durationS),
          formatMah(r.capacityMAh),
          formatWh(r.energyWh),
          r.meanVoltageV !== null ? formatVolts(r.meanVoltageV) : "–",
          formatVolts(r.endVoltageV),
          r.maxTemperatureC !== null ? formatCelsius(r.maxTemperatureC) : "not logged",
          ...(withResistance ? [r.dcResistanceOhm !== null ? formatMilliohm(r.dcResistanceOhm) : "–"] : []),
        ])}
      />
      {payload.retention && <RetentionTable retention={payload.retention} />}
      {payload.observations && <ObservationsTables observations={payload.observations} />}
      {payload.endurance && <EnduranceTables endurance={payload.endurance} />}
      {curves.map((curve, i) => (
        <VqPlot key={`${curve.stepId}#${curve.cycle}`} curve={curve} figure={i + 1} />
      ))}
    </View>
  );
}

/** The endurance block: where it stood, the stop criterion and a summary of the discharge capacity per cycle. */
function EnduranceTables({ endurance }: { endurance: NonNullable<RunCertificatePayload["endurance"]> }) {
  const summary = endurance.cycles.length < endurance.cyclesInAll ? ` The table shows the first cycle, each capacity check, the stop cycle and the last, of ${formatNumber(endurance.cyclesInAll)} cycles in the log.` : "";
  return (
    <Table
      lead={
        <>
          <Tx style={{ ...styles.strong, marginTop: 6 }}>{`Endurance in cycles: "${endurance.blockLabel}"`}</Tx>
          <Tx style={{ ...styles.small, marginBottom: 3 }}>
            {`${formatNumber(endurance.cyclesLogged)} of at most ${formatNumber(endurance.maxCycles)} cycles in the log (${endurance.status}); ${endurance.checks}. ${endurance.stop} Capacity Q = integral of |I| dt over each cycle's discharge, trapezoid rule on the stored log.${summary}`}
          </Tx>
        </>
      }
      columns={[
        { title: "Cycle", width: 20 },
        { title: "Discharge", width: 30 },
        { title: "Discharge capacity", width: 25, align: "right" as const },
        { title: "Of rated", width: 25, align: "right" as const },
      ]}
      rows={endurance.cycles.map((c) => [
        String(c.cycle),
        c.capacityCheck ? "capacity check" : "cycle",
        c.dischargeMAh === null ? "–" : formatMah(c.dischargeMAh),
        c.percentOfRated === null ? "–" : `${formatNumber(c.percentOfRated, { minDecimals: 1, maxDecimals: 1 })} %`,
      ])}
    />
  );
}

/** Observation steps as recorded, then each observation criterion with its rule, the recorded numbers, its outcome and source. */
function ObservationsTables({ observations }: { observations: NonNullable<RunCertificatePayload["observations"]> }) {
  return (
    <>
      <Table
        lead={<Tx style={{ ...styles.strong, marginTop: 6 }}>Observations</Tx>}
        columns={[
          { title: "Step", width: 30 },
          { title: "Recorded", width: 70 },
        ]}
        rows={observations.records.map((r) => [r.stepLabel, r.rows.length === 0 ? "nothing recorded" : r.rows.map((row) => `${row.name}: ${row.value}`).join("; ")])}
      />
      {observations.criteria.length > 0 && (
        <Table
          lead={<Tx style={{ ...styles.small, marginTop: 4, marginBottom: 3 }}>{`Observation criteria. ${observations.decisionRule}`}</Tx>}
          columns={[
            { title: "Criterion", width: 22 },
            { title: "Rule and source", width: 38 },
            { title: "Recorded", width: 25 },
            { title: "Outcome", width: 15 },
          ]}
          rows={observations.criteria.map((c) => [c.name, `${c.rule}${c.source ? ` (${c.source})` : ""}`, c.observed, c.outcome])}
        />
      )}
    </>
  );
}

/** Retention and recovery under the results: each percentage, with the basis it is a share of stated above them. */
function RetentionTable({ retention }: { retention: NonNullable<RunCertificatePayload["retention"]> }) {
  return (
    <Table
      lead={
        <>
          <Tx style={{ ...styles.strong, marginTop: 6 }}>Charge retention and recovery</Tx>
          <Tx style={{ ...styles.small, marginBottom: 3 }}>{`${retention.basis} Percentage = capacity of the discharge / basis × 100.`}</Tx>
        </>
      }
      columns={[
        { title: "Result", width: 34 },
        { title: "Discharge", width: 30 },
        { title: "Capacity", width: 18, align: "right" as const },
        { title: "Percentage", width: 18, align: "right" as const },
      ]}
      rows={retention.rows.map((r) => [
        r.name,
        r.stepLabel,
        r.capacityMAh !== null ? formatMah(r.capacityMAh) : "–",
        r.percent !== null ? `${formatNumber(r.percent, { minDecimals: 1, maxDecimals: 1 })} %` : r.statement,
      ])}
    />
  );
}

function CriterionItem({ k }: { k: RunCertificatePayload["conformity"]["criteria"][number] }) {
  return (
    <View style={{ marginTop: 4 }} wrap={false}>
      <OutcomeLine tone={toneOfConformity(k.outcome)} words={k.outcome} rest={` — ${k.stepLabel}${k.cycle !== null && k.cycle > 1 ? ` (cycle ${k.cycle})` : ""}`} />
      <Field label="Requirement">{k.requirement}</Field>
      <Field label="Measured">{k.measured ?? "no measured value"}</Field>
      <Tx style={styles.small}>{k.statement}</Tx>
    </View>
  );
}

export function ConformitySection({ payload }: P) {
  const c = payload.conformity;
  const [first, ...rest] = c.criteria;
  const observationCriteria = payload.observations?.criteria ?? [];
  const endurance = payload.endurance;
  return (
    <View>
      <View wrap={false}>
        <Heading number={7}>Statement of conformity</Heading>
        <Field label="Decision rule">{describeDecisionRule(c.decisionRule)}</Field>
        {first ? (
          <CriterionItem k={first} />
        ) : observationCriteria.length === 0 && !endurance ? (
          <Tx>The procedure states no acceptance criterion, so no statement of conformity is made.</Tx>
        ) : null}
      </View>
      {rest.map((k) => (
        <CriterionItem key={k.criterionId} k={k} />
      ))}
      {observationCriteria.map((k) => (
        <View key={k.name} style={{ marginTop: 4 }} wrap={false}>
          <OutcomeLine tone={toneOfConformity(k.outcome)} words={k.outcome} rest={` — ${k.name}`} />
          <Field label="Requirement">{`${k.rule}${k.source ? ` (${k.source})` : ""}`}</Field>
          <Field label="Recorded">{k.observed}</Field>
          <Tx style={styles.small}>{payload.observations?.decisionRule ?? ""}</Tx>
        </View>
      ))}
      {endurance && (
        <View style={{ marginTop: 4 }} wrap={false}>
          <OutcomeLine tone={toneOfConformity(endurance.acceptance.outcome)} words={endurance.acceptance.outcome} rest={` — capacity after the cycles of "${endurance.blockLabel}"`} />
          <Tx>{endurance.acceptance.statement}</Tx>
          <Tx style={styles.small}>{`Requirement from ${endurance.acceptance.clause}.`}</Tx>
        </View>
      )}
    </View>
  );
}

function FindingItem({ f }: { f: CertificateFinding }) {
  return (
    <View style={{ marginBottom: 4 }} wrap={false}>
      <Tx style={styles.strong}>{`${f.where}: ${f.title}`}</Tx>
      <Tx>{`Expected ${f.expected}; observed ${f.observed}.`}</Tx>
      <Tx style={styles.small}>{`Requirement from ${f.clause}.`}</Tx>
      {f.reviewerNote !== null && <Tx>{`Reviewer's note: ${f.reviewerNote}`}</Tx>}
    </View>
  );
}

export function DeviationsSection({ payload }: P) {
  const [first, ...rest] = payload.deviations;
  return (
    <View>
      <View wrap={false}>
        <Heading number={9}>Deviations from the method</Heading>
        {first ? <FindingItem f={first} /> : <Tx>{`None: no check of the records or the data log deviates (${payload.checks.meets} of ${payload.checks.total} checks meet).`}</Tx>}
      </View>
      {rest.map((f) => (
        <FindingItem key={f.findingId} f={f} />
      ))}
      {payload.notAssessable.length > 0 && (
        <View style={{ marginTop: 4 }}>
          <Tx style={{ ...styles.label, marginBottom: 2 }}>{`Checks that could not be assessed (${payload.notAssessable.length}):`}</Tx>
          {payload.notAssessable.map((f) => (
            <FindingItem key={f.findingId} f={f} />
          ))}
        </View>
      )}
    </View>
  );
}

/** A line of text with a SHA-256 under it, kept on one page. */
function HashField({ label, text, hash }: { label: string; text: string; hash: string }) {
  return (
    <View wrap={false}>
      <Field label={label}>{text}</Field>
      <Field label="">
        <Tx style={styles.hash}>{hash}</Tx>
      </Field>
    </View>
  );
}

export function EvidenceSection({ payload, payloadSha256 }: P & { payloadSha256: string }) {
  return (
    <View wrap={false}>
      <Heading number={10}>Evidence</Heading>
      <HashField label="Evaluation" text={`made ${formatMoment(payload.evidence.evaluatedAt)}; its findings and results hash (SHA-256 of canonical JSON) to`} hash={payload.evidence.evaluationSha256} />
      {payload.evidence.logs.map((l) => (
        <HashField
          key={l.sha256}
          label={l.part === undefined ? "Data log" : `Data log, part ${l.part}`}
          text={`${l.fileName}: ${formatFigure(l.samples, 0)} samples${l.span ? ` from ${l.span}` : ""}, ${formatFigure(l.sizeBytes, 0)} bytes, ${l.part === undefined ? "uploaded" : "received"} ${formatMoment(l.uploadedAt)}; SHA-256`}
          hash={l.sha256}
        />
      ))}
      {payload.evidence.logs.length === 0 && <Field label="Data log">none: no data log was evaluated</Field>}
      <HashField label="This certificate" text="what it states hashes (SHA-256 of its canonical JSON) to" hash={payloadSha256} />
    </View>
  );
}

/** "reviewed: checked the records…" reads as "reviewed (checked the records…)". */
function describeMeaning(words: string): string {
  const at = words.indexOf(": ");
  return at < 0 ? words : `${words.slice(0, at)} (${words.slice(at + 2)})`;
}

/** A decision rule as the certificate words it (ILAC-G8:09/2019; JCGM 106:2012). */
export function describeDecisionRule(rule: StoredDecisionRule): string {
  const name = nameDecisionRule(rule);
  return `${name.charAt(0).toUpperCase()}${name.slice(1)}: ${explainDecisionRule(rule)}`;
}

export function SignatureBlock({ heading, s, note }: { heading: string; s: { printedName: string; signedAt: string; meaningWords: string }; note?: string }) {
  return (
    <View style={{ flex: 1, paddingRight: 10 }} wrap={false}>
      <Tx style={{ ...styles.label, fontSize: 7.5 }}>{heading}</Tx>
      <Tx style={{ fontSize: 10.5, fontWeight: 700, marginTop: 1 }}>{s.printedName}</Tx>
      <Tx>{formatMoment(s.signedAt)}</Tx>
      <Tx style={styles.small}>{`Meaning: ${describeMeaning(s.meaningWords)}`}</Tx>
      {note && <Tx style={{ ...styles.small, marginTop: 2 }}>{note}</Tx>}
    </View>
  );
}
