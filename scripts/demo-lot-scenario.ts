/**
 * A second, invented delivery of the Korvel cell for the statistics and comparison views: 60 cells
 * from an invented supplier for an invented customer, sampled under ISO 2859-1 (level II, AQL 1.0:
 * code letter E, n = 13, Ac 0, Re 1), the 13 drawn cells given the rated-capacity test, and three
 * more cells of the lot, outside the sample, characterised at several rates. Every figure is made up.
 * Data only: scripts/seed-demo-lot.ts seeds it, and the browser tests read it to know what the demo holds.
 */
export const DEMO_LOT_B = {
  identifier: "KV48-2612-B",
  specification: { maker: "Korvel Energy", model: "KV-21N48" },
  supplier: "Larchmere Cell Trading",
  customer: "Saltmarsh E-Bikes Ltd",
  quantityReceived: 60,
  receivedDaysAgo: 16,
  notes: "Delivered on two trays of 30; cells numbered by tray position 1 to 60. Sampled for the rated-capacity test; three further cells kept for rate characterisation.",
  plan: { inspectionLevel: "II", aql: "1.0", acceptanceProcedure: "TPL-RC20" },
  /** The seed of the random draw, recorded with it. */
  drawSeed: 2612,
  /**
   * Capacity of the simple cell model of each drawn cell, in draw order. Invented; the model delivers
   * about 4.6 % more to 2.5 V at 0.2 It, so the rated-capacity results spread over about 4 880 mAh to 5 060 mAh.
   */
  sampledModelCapacityMah: [4756, 4697, 4800, 4729, 4837, 4741, 4671, 4787, 4763, 4715, 4817, 4749, 4776],
  /**
   * The three cells for the rate series (RATE: 0.2 It, 0.5 It, 1 It and the maximum continuous
   * current). On the third the channel was programmed at 10.2 A for the last discharge instead of
   * the cell's 9.7 A: the operator acknowledged the caution, the reviewer accepted the run with notes,
   * and the result is marked as above the rating.
   */
  rateCells: [
    { modelCapacityMah: 4730, resistanceOhm: 0.028 },
    { modelCapacityMah: 4765, resistanceOhm: 0.031 },
    { modelCapacityMah: 4748, resistanceOhm: 0.03, maxDischargeProgrammedA: 10.2 },
  ] as { modelCapacityMah: number; resistanceOhm: number; maxDischargeProgrammedA?: number }[],
} as const;
