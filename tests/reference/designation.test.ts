import { describe, expect, it } from 'vitest';
import { computeDesignation, roundUpToWholeMm } from '@/protocols';

// REFERENCES.md §11: IEC 61960 clause 5.1 designation [published]: I = lithium ion, N = nickel
// positive electrode, R = cylindrical, P = prismatic; maximum dimensions rounded up to whole mm.
describe('IEC 61960 cell designation (REFERENCES.md §11) [published]', () => {
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
