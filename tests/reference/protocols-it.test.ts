import { describe, expect, it } from 'vitest';
import { computeItAmperes, resolveCurrent, type CellSpecification } from '@/protocols';
import { inventedCell } from '@/scenarios/invented-cells';

function cellRated(ratedCapacityMah: number): CellSpecification {
  return { ...inventedCell, designation: undefined, ratedCapacityMah, minimumCapacityMah: undefined };
}

function amperes(multipleOfIt: number, ratedCapacityMah: number): number {
  const result = resolveCurrent({ multipleOfIt }, cellRated(ratedCapacityMah));
  if (!result.ok) throw new Error(result.message);
  return result.resolved.value;
}

// docs/references.md §1: IEC 61434:1996, It A = Cn Ah / 1 h [published]. Columns: 0.2 It, 0.5 It, 1 It,
// 1/3 It, C/20 (= 0.05 It). Values with four decimals in the table are rounded there.
const itTable: Array<{ cnAh: number; currents: [number, number, number, number, number] }> = [
  { cnAh: 2.5, currents: [0.5, 1.25, 2.5, 0.8333, 0.125] },
  { cnAh: 3.0, currents: [0.6, 1.5, 3.0, 1.0, 0.15] },
  { cnAh: 2.0, currents: [0.4, 1.0, 2.0, 0.6667, 0.1] },
  { cnAh: 5.0, currents: [1.0, 2.5, 5.0, 1.6667, 0.25] },
];
const multiples = [0.2, 0.5, 1, 1 / 3, 1 / 20];

describe('reference test current It (IEC 61434:1996, docs/references.md §1) [published]', () => {
  for (const row of itTable) {
    it(`Cn = ${row.cnAh} Ah: It = ${row.cnAh} A — IEC 61434 [published]`, () => {
      expect(computeItAmperes(row.cnAh * 1000)).toBe(row.cnAh);
    });

    row.currents.forEach((expected, column) => {
      const multiple = multiples[column]!;
      const isThird = column === 3;
      it(`Cn = ${row.cnAh} Ah, ${isThird ? '1/3' : multiple} It = ${expected} A — IEC 61434 table [published]`, () => {
        const value = amperes(multiple, row.cnAh * 1000);
        if (isThird) expect(value).toBeCloseTo(expected, 4);
        else expect(value).toBe(expected);
      });
    });
  }

  it('0.2 It of 3 000 mAh is 0.6 A, and the trace says so — docs/design.md §6, IEC 61434 [published]', () => {
    const result = resolveCurrent({ multipleOfIt: 0.2 }, cellRated(3000));
    expect(result.ok && result.resolved.explanation).toBe('0.2 × It = 0.6 A from rated 3 000 mAh');
  });

  it('0.2 It A of a 5 000 mAh cell is 1.0 A — docs/design.md §3, IEC 61434 [published]', () => {
    expect(amperes(0.2, 5000)).toBe(1);
  });

  it('0.1 C of 5 Ah is 0.5 A — Linden\'s Handbook of Batteries, I = M × Cn [published]', () => {
    expect(amperes(0.1, 5000)).toBe(0.5);
  });

  it('0.2 × 4 850 mAh is 0.97 A — common practice (a "0.2 C" current of a 4 850 mAh cell)', () => {
    expect(amperes(0.2, 4850)).toBe(0.97);
    const result = resolveCurrent({ multipleOfIt: 0.2 }, cellRated(4850));
    expect(result.ok && result.resolved.explanation).toBe('0.2 × It = 0.97 A from rated 4 850 mAh');
  });
});
