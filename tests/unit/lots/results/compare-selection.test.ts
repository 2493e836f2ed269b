import { describe, expect, it } from "vitest";
import {
  chosenDischargesSchema,
  formatCompareHref,
  formatDischargeKey,
  listMultiplesOfIt,
  MAX_OVERLAID,
  parseDischargeKey,
  pickOneSpecimenAtSeveralCurrents,
  pickSpecimensAtOneCurrent,
  PRESET_SPECIMENS,
  readCompareQuery,
} from "@/lib/lots/results/compare-selection";

// An invented 3 000 mAh cell: It = 3 A (IEC 61434), so 0.2 It = 0.6 A.
const rating = { ratedCapacityMah: 3000 };
const discharge = (runNumber: string, specimenId: string, currentA: number, capacityAh = 3, stepId = "discharge") => ({
  runNumber,
  stepId,
  cycle: 1,
  specimenId,
  currentA,
  capacityAh,
  rating,
});

describe("discharge keys in the address", () => {
  it("reads back what it writes, and refuses anything else", () => {
    const key = { runNumber: "R-00014", stepId: "discharge-1it", cycle: 2 };
    expect(parseDischargeKey(formatDischargeKey(key))).toEqual(key);
    for (const bad of ["", "R-00014", "R-00014.discharge", "R-00014.discharge.0", "X-1.discharge.1", "R-1.-bad.1", "R-1.a b.1"]) {
      expect(parseDischargeKey(bad), bad).toBeNull();
    }
  });

  it("drops repeats, refuses more than the overlay can show, and names a bad key in words", () => {
    expect(chosenDischargesSchema.parse(["R-1.d.1", "R-1.d.1", "R-2.d.1"])).toHaveLength(2);
    expect(chosenDischargesSchema.safeParse(Array.from({ length: MAX_OVERLAID + 1 }, (_, k) => `R-${k}.d.1`)).success).toBe(false);
    const refused = chosenDischargesSchema.safeParse(["nonsense"]);
    expect(!refused.success && refused.error.issues[0]?.message).toMatch(/"nonsense" is not a discharge/);
  });

  it("keeps the readable part of a page address and says what it left out", () => {
    const q = readCompareQuery({ spec: "not-a-uuid", lot: "0b9e1c8e-3c1a-4d6f-9a55-5b6f1f0e2a11", current: "-1", d: ["R-3.discharge.1", "junk", "R-3.discharge.1"] });
    expect(q.specificationId).toBeUndefined();
    expect(q.lotId).toBe("0b9e1c8e-3c1a-4d6f-9a55-5b6f1f0e2a11");
    expect(q.multipleOfIt).toBeUndefined();
    expect(q.chosen).toEqual([{ runNumber: "R-3", stepId: "discharge", cycle: 1 }]);
    expect(q.ignored).toHaveLength(3);
    expect(formatCompareHref({ lotId: q.lotId, multipleOfIt: 0.2, chosen: q.chosen })).toBe(`/compare?lot=${q.lotId}&current=0.2&d=R-3.discharge.1`);
  });
});

describe("the two quick choices", () => {
  const pool = [
    discharge("R-1", "a", 0.6, 3.0),
    discharge("R-2", "b", 0.6, 3.1),
    discharge("R-2", "b", 1.5, 3.05, "discharge-05it"),
    discharge("R-2", "b", 3.0, 3.0, "discharge-1it"),
    discharge("R-4", "b", 0.601, 3.12, "discharge-again"),
    discharge("R-3", "c", 0.605, 2.9),
  ];

  it("one specimen at several currents: the specimen with the most currents, one curve per current, the latest run's", () => {
    const keys = pickOneSpecimenAtSeveralCurrents(pool);
    expect(keys.map(formatDischargeKey)).toEqual(["R-4.discharge-again.1", "R-2.discharge-05it.1", "R-2.discharge-1it.1"]);
    expect(pickOneSpecimenAtSeveralCurrents(pool, "a").map(formatDischargeKey)).toEqual(["R-1.discharge.1"]);
  });

  it("several specimens at one current: one each, within 2 % of the current, ordered by capacity", () => {
    expect(pickSpecimensAtOneCurrent(pool, 0.2).map(formatDischargeKey)).toEqual(["R-3.discharge.1", "R-1.discharge.1", "R-2.discharge.1"]);
    expect(pickSpecimensAtOneCurrent(pool, 1)).toHaveLength(1);
  });

  it("draws the lowest, the highest and evenly spaced ones between when there are many", () => {
    const many = Array.from({ length: 16 }, (_, k) => discharge(`R-${100 + k}`, `s${k}`, 0.6, 3 + k / 100));
    const picked = pickSpecimensAtOneCurrent(many, 0.2).map((k) => k.runNumber);
    expect(picked).toHaveLength(PRESET_SPECIMENS);
    expect(picked[0]).toBe("R-100");
    expect(picked.at(-1)).toBe("R-115");
  });

  it("lists each current once as a multiple of It", () => {
    expect(listMultiplesOfIt(pool)).toEqual([0.2, 0.5, 1]);
  });
});
