import { View } from "@react-pdf/renderer";
import { formatFigure, formatMah, formatMoment, formatPercent, formatWh, withUnit } from "./certificate-format";
import type { OutcomeTone } from "./certificate-figures";
import type { LotCertificatePayload } from "./certificate-payload";
import { Field, Heading, ink, rule, styles, Table, Tx } from "./certificate-primitives";
import { describeDatasheet, describeDecisionRule, OutcomeLine } from "./certificate-sections";

type P = { payload: LotCertificatePayload };

const cells = (n: number) => `${formatFigure(n, 0)} ${n === 1 ? "cell" : "cells"}`;
const RESULT_TONE: Record<LotCertificatePayload["sample"][number]["result"], OutcomeTone> = {
  conforms: "meets",
  "does not conform": "deviates",
  "not decided": "open",
  "not tested": "open",
};

export function LotTitleBlock({ payload }: P) {
  const d = payload.lotDecision;
  return (
    <View>
      <Tx style={{ fontSize: 20, fontWeight: 700, lineHeight: 1.2 }}>{payload.title}</Tx>
      <Tx style={{ fontSize: 10, marginTop: 4 }}>{`No. ${payload.number}   ·   issued ${formatMoment(payload.issuedAt)}   ·   lot ${payload.lot.identifier}`}</Tx>
      {payload.replaces && (
        <View style={{ marginTop: 8, padding: 6, borderWidth: 0.8, borderColor: ink, borderStyle: "solid" }} wrap={false}>
          <Tx style={styles.strong}>{`Amendment: this certificate replaces certificate ${payload.replaces.number}, which is withdrawn.`}</Tx>
          <Tx>{`Reason: ${payload.replaces.reason}`}</Tx>
        </View>
      )}
      <View style={{ marginTop: 10, paddingVertical: 6, borderTopWidth: 0.8, borderBottomWidth: 0.8, borderColor: rule }}>
        <OutcomeLine
          large
          tone={d.verdict === "accept" ? "meets" : "deviates"}
          words={d.verdict === "accept" ? "Lot accepted" : "Lot rejected"}
          rest={` — ${d.statement} Sampling plan: ISO 2859-1 code letter ${payload.samplingPlan.codeLetter}, n = ${payload.samplingPlan.sampleSize}, Ac ${payload.samplingPlan.acceptanceNumber}, Re ${payload.samplingPlan.rejectionNumber} (sections 4 and 6).`}
        />
      </View>
    </View>
  );
}

export function LotItemSection({ payload }: P) {
  const { lot, cell } = payload;
  return (
    <View wrap={false}>
      <Heading number={2}>Lot</Heading>
      <Field label="Lot">{lot.identifier}</Field>
      <Field label="Cell">{`${cell.maker} ${cell.model}, ${cell.designation}, ${cell.chemistry}`}</Field>
      <Field label="Datasheet values">{describeDatasheet(cell)}</Field>
      <Field label="Supplier">{lot.supplier}</Field>
      <Field label="Quantity received">{`${cells(lot.quantityReceived)} (the lot size), tray positions 1 to ${formatFigure(lot.quantityReceived, 0)}`}</Field>
      <Field label="Date of receipt">{lot.receivedOn}</Field>
    </View>
  );
}

export function LotMethodSection({ payload }: P) {
  const t = payload.testing;
  const m = payload.method;
  return (
    <View wrap={false}>
      <Heading number={3}>Method and dates</Heading>
      <Field label="Acceptance procedure">{m.acceptanceProcedure ? `${m.acceptanceProcedure}: each drawn cell is judged by the statement of conformity of its reviewed run of this procedure.` : "Any procedure: each drawn cell is judged by the statement of conformity of its latest reviewed run."}</Field>
      {m.procedures.map((p) => (
        <Field key={`${p.code}#${p.version}`} label="Procedure">{`${p.code} version ${p.version}: ${p.title} (${p.standard}, ${p.clause})`}</Field>
      ))}
      <Field label="Dates of testing">{t.from && t.to ? `${formatMoment(t.from)} to ${formatMoment(t.to)} (first to last sampled run)` : "not recorded"}</Field>
      <Field label="Date of issue">{formatMoment(payload.issuedAt)}</Field>
    </View>
  );
}

export function SamplingPlanSection({ payload }: P) {
  const s = payload.samplingPlan;
  return (
    <View wrap={false}>
      <Heading number={4}>Sampling plan</Heading>
      <Field label="Standard">{s.source}</Field>
      <Field label="Inspection">{`general inspection level ${s.inspectionLevel}, AQL ${s.aql} % nonconforming, ${s.severity} inspection, single sampling`}</Field>
      <Field label="Code letter">{s.initialCodeLetter === s.codeLetter ? s.codeLetter : `${s.initialCodeLetter} (Table 1), plan of ${s.codeLetter} (Table 2-A arrow)`}</Field>
      <Field label="Sample size n">{cells(s.sampleSize)}</Field>
      <Field label="Acceptance number Ac">{formatFigure(s.acceptanceNumber, 0)}</Field>
      <Field label="Rejection number Re">{formatFigure(s.rejectionNumber, 0)}</Field>
      {s.hundredPercentNote && <Field label="100 % inspection">{s.hundredPercentNote}</Field>}
      <Field label="How the plan follows">
        <View>
          {s.explanation.map((step, i) => (
            <Tx key={i}>{`${i + 1}. ${step}`}</Tx>
          ))}
        </View>
      </Field>
    </View>
  );
}

export function DrawSection({ payload }: P) {
  const withEnergy = payload.sample.some((c) => c.energyWh !== null);
  return (
    <View>
      <Table
        lead={
          <>
            <Heading number={5}>Drawn sample and results</Heading>
            <Tx style={{ marginBottom: 2 }}>{`${payload.draw.description} Drawn ${formatMoment(payload.draw.drawnAt)}.`}</Tx>
            <Tx style={{ ...styles.small, marginBottom: 3 }}>
              Capacity and energy: the run&apos;s discharge at 0.2 It (its last cycle), as its accepting reviewer signed for it. The statement of conformity is the run&apos;s own.
            </Tx>
          </>
        }
        columns={[
          { title: "Position", width: 9, align: "right" },
          { title: "Specimen", width: 20 },
          { title: "Run", width: 11 },
          { title: "Run certificate", width: 13 },
          { title: "Capacity at 0.2 It", width: withEnergy ? 14 : 20, align: "right" },
          ...(withEnergy ? [{ title: "Energy", width: 10, align: "right" as const }] : []),
          { title: "Statement of conformity", width: withEnergy ? 23 : 27 },
        ]}
        rows={payload.sample.map((c) => [
          formatFigure(c.position, 0),
          c.specimen ?? "not registered",
          c.run ?? "–",
          c.runCertificate ?? "none",
          c.capacityMAh !== null ? formatMah(c.capacityMAh) : "–",
          ...(withEnergy ? [c.energyWh !== null ? formatWh(c.energyWh) : "–"] : []),
          c.result,
        ])}
      />
    </View>
  );
}

export function LotDecisionSection({ payload }: P) {
  const d = payload.lotDecision;
  const c = payload.counts;
  return (
    <View wrap={false}>
      <Heading number={6}>Lot decision</Heading>
      <OutcomeLine tone={d.verdict === "accept" ? "meets" : "deviates"} words={d.words} rest={` — ${d.statement}`} />
      <Field label="Rule">{d.rule}</Field>
      <Field label="Counts">
        {`${cells(c.drawn)} drawn, ${cells(c.registered)} registered, ${cells(c.tested)} tested (conforms or does not conform), ${formatFigure(c.nonconforming, 0)} not conforming, ${formatFigure(c.notDecided, 0)} not decided`}
      </Field>
      <Field label="Cells judged under">{payload.cellDecisionRules.length === 0 ? "no cell was tested" : payload.cellDecisionRules.map(describeDecisionRule).join(" ")}</Field>
      <Field label="Resting on the sample">{payload.sampleStatement}</Field>
      {payload.samplingContext && <Field label="Use of ISO 2859-1">{payload.samplingContext}</Field>}
      {payload.sample.some((m) => m.result !== "conforms") && (
        <View style={{ marginTop: 3 }}>
          {payload.sample
            .filter((m) => m.result !== "conforms")
            .map((m) => (
              <OutcomeLine key={m.position} tone={RESULT_TONE[m.result]} words={m.result} rest={` — tray position ${m.position}${m.specimen ? `, specimen ${m.specimen}` : ""}${m.run ? `, run ${m.run}` : ""}`} />
            ))}
        </View>
      )}
    </View>
  );
}

export function LotStatisticsSection({ payload }: P) {
  const s = payload.statistics;
  return (
    <View wrap={false}>
      <Heading number={7}>Capacity of the sample at 0.2 It</Heading>
      {s ? (
        <>
          <Field label="Results">{`${formatFigure(s.count, 0)} discharges at ${withUnit(s.currentA, 3, "A")}, one per sampled cell`}</Field>
          <Field label="Mean">{formatMah(s.meanMAh)}</Field>
          <Field label="Standard deviation s">{`${withUnit(s.standardDeviationMAh, 1, "mAh")} (sample, n − 1)`}</Field>
          <Field label="Lowest and highest">{`${formatMah(s.minMAh)} and ${formatMah(s.maxMAh)}`}</Field>
          <Field label="At or above rated">{`${formatFigure(s.countAtOrAboveRated, 0)} of ${formatFigure(s.count, 0)} (${formatPercent(s.shareAtOrAboveRated, 0)}) at or above the rated ${formatMah(s.ratedCapacityMAh)}`}</Field>
          <Field label="Cpl">
            {s.minimumCapacityMAh !== null
              ? `${s.cpl !== null ? formatFigure(s.cpl, 2) : "not defined"} against the minimum capacity ${formatMah(s.minimumCapacityMAh)}: ${s.cplFormula}, LSL = minimum capacity (${s.cplSource})`
              : "not given"}
          </Field>
          {s.note && <Tx style={styles.small}>{s.note}</Tx>}
          <Tx style={styles.small}>These figures describe the sample; the lot decision above rests on the statements of conformity, not on them.</Tx>
        </>
      ) : (
        <Tx>{payload.statisticsNote ?? "No statistics."}</Tx>
      )}
    </View>
  );
}
