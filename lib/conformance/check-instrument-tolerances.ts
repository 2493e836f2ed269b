import { computeHalfWidth } from "@/lib/analysis";
import { formatNumber, type ProcedureResolution } from "@/protocols";
import { createRunFinding, type Finding } from "./finding";
import { citeProcedure } from "./format-value";
import type { RunInstrument } from "./run-evaluation-input";

const pct = (x: number) => `${formatNumber(x, { maxDecimals: 3 })} %`;

/**
 * Each instrument's stated accuracy meets the measurement tolerances the procedure holds (IEC
 * 61960-3 clause 4 by default: voltage ±1 %, current ±1 %, temperature ±2 °C, time ±0.1 %, all
 * sources of error included; docs/references.md §3, recalled for 61960-3, published via IEC 61951-2:2022
 * clause 4; held as parameters in protocols/measurement-tolerances.ts). A cycler channel is checked
 * at every set-point current and voltage of the run's charge and discharge steps; a thermometer or
 * climate chamber against the temperature tolerance. A run whose instruments do not meet them is flagged.
 * An accuracy the register does not state is not checked (the budget says it is not evaluated); with
 * nothing stated at all there is no finding.
 */
export function checkInstrumentTolerances(instruments: readonly RunInstrument[], resolution: ProcedureResolution, citation: string | null): Finding | null {
  const problems: string[] = [];
  const unstated: string[] = [];
  let checked = 0;
  for (const instrument of instruments) {
    const { accuracy, identifier } = instrument;
    if (instrument.kind === "cycler-channel") {
      for (const step of resolution.steps) {
        if (step.kind !== "charge" && step.kind !== "discharge") continue;
        const { currentPercent, voltagePercent, timePercent } = step.tolerances;
        const currentA = step.current?.value;
        const voltageV = step.kind === "charge" ? step.voltage?.value : step.endVoltage?.value;
        const readings: [string, number | undefined, typeof accuracy.current, number, string][] = [
          ["current", currentA, accuracy.current, currentPercent.value, "A"],
          ["voltage", voltageV, accuracy.voltage, voltagePercent.value, "V"],
        ];
        for (const [what, reading, stated, allowed, unit] of readings) {
          if (reading === undefined) continue;
          if (stated === undefined) {
            unstated.push(`${identifier} states no ${what} accuracy`);
            continue;
          }
          checked++;
          const relative = (computeHalfWidth({ form: "percent-of-reading-and-range", ...stated }, reading) / reading) * 100;
          if (relative > allowed) problems.push(`${identifier}: ±${pct(relative)} at ${formatNumber(reading, { maxDecimals: 3 })} ${unit} (${step.label}), more than the ±${pct(allowed)} allowed`);
        }
        if (accuracy.time === undefined) unstated.push(`${identifier} states no time accuracy`);
        else {
          checked++;
          const relative = accuracy.time.ppm / 10_000;
          if (relative > timePercent.value) problems.push(`${identifier}: time ±${pct(relative)}, more than the ±${pct(timePercent.value)} allowed`);
        }
      }
    }
    if (instrument.kind === "thermometer" || instrument.kind === "climate-chamber") {
      const allowed = Math.min(...resolution.steps.map((step) => step.tolerances.temperatureC.value));
      if (accuracy.temperature === undefined) unstated.push(`${identifier} states no temperature accuracy`);
      else {
        checked++;
        if (accuracy.temperature.halfWidth > allowed) problems.push(`${identifier}: ±${formatNumber(accuracy.temperature.halfWidth)} °C, more than the ±${formatNumber(allowed)} °C allowed`);
      }
    }
  }
  const unique = [...new Set(unstated)];
  if (checked === 0) return null;
  const outcome = problems.length > 0 ? "deviates" : "meets";
  const notChecked = unique.length > 0 ? `; not checked: ${unique.join("; ")}` : "";
  const observed = problems.length > 0 ? `${problems.join("; ")}${notChecked}` : `every stated accuracy is within the tolerances (${checked} checks)${notChecked}`;
  return createRunFinding({
    rule: "instruments-meet-tolerances",
    title: "Instruments accurate enough for the measurement tolerances",
    expected: { text: "each instrument's stated accuracy within the procedure's measurement tolerances (by default IEC 61960-3 clause 4: current ±1 %, voltage ±1 %, time ±0.1 %, temperature ±2 °C)" },
    observed: { text: observed },
    outcome,
    clause: `${citeProcedure(citation, "measurement tolerances")}; IEC 61960-3 clause 4 (recalled; same wording in IEC 61951-2:2022 clause 4)`,
  });
}
