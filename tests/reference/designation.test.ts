import { describe, expect, it } from 'vitest';
import { computeDesignation, roundUpToWholeMm, writeDimension } from '@/protocols';

// docs/references.md §11: IEC 61960 clause 5.1 designation [published]: I = lithium ion, N = nickel
// positive electrode, R = cylindrical, P = prismatic; maximum dimensions rounded up to whole mm.
describe('IEC 61960 cell designation (docs/references.md §11) [published]', () => {
  it('Ø 21.4 mm × 70.3 mm, nickel positive → INR22/71 — IEC 61960 clause 5.1 [published]', () => {
    expect(
      computeDesignation({
        chemistry: { positiveElectrode: 'N' },
        shape: 'cylindrical',
        maxDiameterMm: 21.4,
        maxHeightMm: 70.3,
      }),
    ).toEqual({ ok: true, designation: 'INR22/71' });
  });

  it('an 18650-size cell, Ø 18.4 mm × 65.2 mm → INR19/66 — IEC 61960 clause 5.1 [published]', () => {
    expect(
      computeDesignation({
        chemistry: { positiveElectrode: 'N' },
        shape: 'cylindrical',
        maxDiameterMm: 18.4,
        maxHeightMm: 65.2,
      }),
    ).toEqual({ ok: true, designation: 'INR19/66' });
  });

  it('a whole mm stays as it is when rounding up — IEC 61960 clause 5.1 rule [published], arithmetic', () => {
    expect(roundUpToWholeMm(22)).toBe(22);
    expect(roundUpToWholeMm(22.01)).toBe(23);
    // 0.1 × 220 is 22.000000000000004 in binary floating point: still 22 mm.
    expect(roundUpToWholeMm(0.1 * 220)).toBe(22);
    expect(
      computeDesignation({ chemistry: { positiveElectrode: 'C' }, shape: 'cylindrical', maxDiameterMm: 18, maxHeightMm: 65 }),
    ).toEqual({ ok: true, designation: 'ICR18/65' });
  });

  it('prismatic: thickness/width/height, each rounded up — IEC 61960 clause 5.1 form N2/N3/N4 [published], arithmetic', () => {
    expect(
      computeDesignation({
        chemistry: { positiveElectrode: 'C' },
        shape: 'prismatic',
        maxThicknessMm: 5.4,
        maxWidthMm: 34,
        maxHeightMm: 50.2,
      }),
    ).toEqual({ ok: true, designation: 'ICP6/34/51' });
  });
});

// Further positive-electrode letters F (iron), Fp (iron phosphate), Mp (manganese phosphate), X (other) — an IECEE CTL
// decision on cell designations under IEC 62133 [published; text seen in a public copy, the decision sheet's number not
// confirmed: see docs/references.md]. Dimensions below 1 mm in tenths with a leading "t" — IEC 61960 clause 5.1
// [published, via a public copy of the clause: ICPt73448 is a prismatic cobalt cell 0.7 mm thick].
describe('further positive-electrode letters and the tN form (docs/references.md §11)', () => {
  it.each([
    ['F', 'IFR19/66'],
    ['Fp', 'IFpR19/66'],
    ['Mp', 'IMpR19/66'],
    ['X', 'IXR19/66'],
  ] as const)('%s on an 18650-size cell (Ø 18.4 × 65.2 mm) → %s', (letter, designation) => {
    expect(computeDesignation({ chemistry: { positiveElectrode: letter }, shape: 'cylindrical', maxDiameterMm: 18.4, maxHeightMm: 65.2 })).toEqual({ ok: true, designation });
  });

  it('the demo iron-phosphate cell, Ø 26.2 × 65.4 mm → IFpR27/66 (clause 5.1 rounding, arithmetic)', () => {
    expect(computeDesignation({ chemistry: { positiveElectrode: 'Fp' }, shape: 'cylindrical', maxDiameterMm: 26.2, maxHeightMm: 65.4 })).toEqual({ ok: true, designation: 'IFpR27/66' });
  });

  it('a thickness of 0.7 mm is written t7; 0.65 mm rounds up to t7; 1 mm and more stay whole mm', () => {
    expect(computeDesignation({ chemistry: { positiveElectrode: 'C' }, shape: 'prismatic', maxThicknessMm: 0.7, maxWidthMm: 34, maxHeightMm: 48 })).toEqual({ ok: true, designation: 'ICPt7/34/48' });
    expect(writeDimension(0.65)).toBe('t7');
    expect(writeDimension(0.1 * 7)).toBe('t7');
    expect(writeDimension(1)).toBe('1');
  });
});
