import fc from "fast-check";
import type { ExpectedStep } from "@/lib/analysis/match-steps";
import type { SyntheticLogOptions, SyntheticStep } from "@/lib/analysis/synthetic-log";

/** A random but physically sensible test plan: CC-CV charge, rest, optional DC pulse, discharge, rest; one or two cycles. */
export const arbitraryPlan = fc
  .record({
    capacityMAh: fc.integer({ min: 1000, max: 5000 }),
    resistanceOhm: fc.double({ min: 0.01, max: 0.08, noNaN: true }),
    initialSoc: fc.double({ min: 0.05, max: 0.4, noNaN: true }),
    chargeIt: fc.double({ min: 0.5, max: 1, noNaN: true }),
    chargeVoltageV: fc.double({ min: 4.1, max: 4.2, noNaN: true }),
    terminationIt: fc.double({ min: 0.02, max: 0.05, noNaN: true }),
    dischargeIt: fc.double({ min: 0.5, max: 1, noNaN: true }),
    endVoltageV: fc.double({ min: 2.75, max: 3.0, noNaN: true }),
    restS: fc.integer({ min: 300, max: 1800 }),
    withPulse: fc.boolean(),
    cycles: fc.integer({ min: 1, max: 2 }),
    sampleIntervalS: fc.double({ min: 2, max: 10, noNaN: true }),
    samplingJitter: fc.double({ min: 0, max: 0.5, noNaN: true }),
    seed: fc.integer(),
  })
  .map((p) => {
    const it = p.capacityMAh / 1000;
    const steps: SyntheticStep[] = [];
    for (let cycle = 0; cycle < p.cycles; cycle++) {
      steps.push({ kind: "charge", currentA: p.chargeIt * it, voltageV: p.chargeVoltageV, terminationCurrentA: Math.max(0.02, p.terminationIt * it) });
      steps.push({ kind: "rest", durationS: p.restS });
      if (p.withPulse) {
        steps.push({ kind: "pulse", baseCurrentA: 0.2 * it, baseDurationS: 10, pulseCurrentA: it, pulseDurationS: 1, sampleIntervalS: 0.1 });
        steps.push({ kind: "rest", durationS: p.restS });
      }
      steps.push({ kind: "discharge", currentA: p.dischargeIt * it, endVoltageV: p.endVoltageV });
      steps.push({ kind: "rest", durationS: p.restS });
    }
    const options: SyntheticLogOptions = {
      cell: { capacityMAh: p.capacityMAh, seriesResistanceOhm: p.resistanceOhm, initialSoc: p.initialSoc },
      steps,
      seed: p.seed,
      sampleIntervalS: p.sampleIntervalS,
      samplingJitter: p.samplingJitter,
      temperature: { ambientC: 23, heatingCPerW: 4 },
    };
    const expected: ExpectedStep[] = steps.map((step, k) => ({ id: `step-${k + 1}`, kind: step.kind }));
    return { options, expected, terminationA: Math.max(0.02, p.terminationIt * it) };
  });
