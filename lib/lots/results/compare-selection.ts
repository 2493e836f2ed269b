import { z } from "zod";
import { computeItA, defaultCurrentTolerance } from "@/lib/statistics/group-by-current";
import { roundSignificant } from "@/protocols/format-number";

/** At most this many discharges in one overlay: beyond it the curves cannot be told apart. */
export const MAX_OVERLAID = 12;

/** One discharge of one run: "R-00014.discharge-1it.1" in the URL (run number, step id, cycle). */
export interface DischargeKey {
  runNumber: string;
  stepId: string;
  cycle: number;
}

const keyPattern = /^(R-\d{1,12})\.([A-Za-z0-9][A-Za-z0-9_-]{0,63})\.(\d{1,4})$/;

export function formatDischargeKey(k: DischargeKey): string {
  return `${k.runNumber}.${k.stepId}.${k.cycle}`;
}

export function parseDischargeKey(text: string): DischargeKey | null {
  const m = keyPattern.exec(text);
  if (!m) return null;
  const cycle = Number(m[3]);
  return cycle >= 1 ? { runNumber: m[1] as string, stepId: m[2] as string, cycle } : null;
}

export const dischargeKeySchema = z
  .string()
  .transform((text, ctx) => {
    const key = parseDischargeKey(text);
    if (!key) {
      ctx.addIssue({ code: "custom", message: `"${text.slice(0, 80)}" is not a discharge: write run number, step and cycle, e.g. R-00014.discharge.1` });
      return z.NEVER;
    }
    return key;
  });

/** The chosen discharges of a series request or a CSV export, as the URL carries them (`d`, repeated). */
export const chosenDischargesSchema = z
  .array(dischargeKeySchema)
  .max(MAX_OVERLAID, `Choose at most ${MAX_OVERLAID} discharges to overlay.`)
  .transform((keys) => {
    const seen = new Set<string>();
    return keys.filter((k) => {
      const text = formatDischargeKey(k);
      if (seen.has(text)) return false;
      seen.add(text);
      return true;
    });
  });

/** What the compare page reads from its URL; anything unreadable is dropped and named in `ignored`. */
export interface CompareQuery {
  specificationId?: string;
  lotId?: string;
  specimenId?: string;
  /** Multiple of It to list (0.2 for 0.2 It). */
  multipleOfIt?: number;
  chosen: DischargeKey[];
  ignored: string[];
}

type SearchParams = Record<string, string | string[] | undefined>;

const listOf = (v: string | string[] | undefined): string[] => (v === undefined ? [] : Array.isArray(v) ? v : [v]);
const firstOf = (v: string | string[] | undefined): string | undefined => listOf(v).find((x) => x !== "");

export function readCompareQuery(params: SearchParams): CompareQuery {
  const ignored: string[] = [];
  const readId = (name: string, words: string): string | undefined => {
    const v = firstOf(params[name]);
    if (v === undefined) return undefined;
    if (z.uuid().safeParse(v).success) return v;
    ignored.push(`the ${words} in the address is not one of ours`);
    return undefined;
  };
  const current = firstOf(params.current);
  const multipleOfIt = current === undefined ? undefined : Number(current);
  if (multipleOfIt !== undefined && !(Number.isFinite(multipleOfIt) && multipleOfIt > 0)) ignored.push(`"${current}" is not a multiple of It`);
  const chosen: DischargeKey[] = [];
  for (const text of listOf(params.d)) {
    const key = parseDischargeKey(text);
    if (!key) ignored.push(`"${text.slice(0, 80)}" is not a discharge`);
    else if (!chosen.some((k) => formatDischargeKey(k) === text)) chosen.push(key);
  }
  if (chosen.length > MAX_OVERLAID) ignored.push(`only the first ${MAX_OVERLAID} chosen discharges are drawn`);
  const specificationId = readId("spec", "cell specification");
  const lotId = readId("lot", "lot");
  const specimenId = readId("specimen", "specimen");
  return {
    ...(specificationId && { specificationId }),
    ...(lotId && { lotId }),
    ...(specimenId && { specimenId }),
    ...(multipleOfIt !== undefined && Number.isFinite(multipleOfIt) && multipleOfIt > 0 && { multipleOfIt }),
    chosen: chosen.slice(0, MAX_OVERLAID),
    ignored,
  };
}

/** The address of the compare page for a query. */
export function formatCompareHref(q: Omit<CompareQuery, "ignored">): string {
  const p = new URLSearchParams();
  if (q.specificationId) p.set("spec", q.specificationId);
  if (q.lotId) p.set("lot", q.lotId);
  if (q.specimenId) p.set("specimen", q.specimenId);
  if (q.multipleOfIt !== undefined) p.set("current", String(q.multipleOfIt));
  for (const k of q.chosen) p.append("d", formatDischargeKey(k));
  const text = p.toString();
  return text ? `/compare?${text}` : "/compare";
}

/** A discharge as the overlay lists need it. */
export interface OverlayCandidate {
  runNumber: string;
  stepId: string;
  cycle: number;
  specimenId: string;
  currentA: number;
  rating: { ratedCapacityMah: number };
}

/** currentA / It of the candidate's cell (IEC 61434), to 3 decimals. */
export function computeMultipleOfIt(c: Pick<OverlayCandidate, "currentA" | "rating">): number {
  return roundSignificant(Math.round((c.currentA / computeItA(c.rating.ratedCapacityMah)) * 1000) / 1000);
}

/** Whether a discharge ran at the given multiple of It, within the 2 % of lib/statistics' current groups. */
export function isAtMultiple(c: Pick<OverlayCandidate, "currentA" | "rating">, multipleOfIt: number): boolean {
  const target = multipleOfIt * computeItA(c.rating.ratedCapacityMah);
  return Math.abs(c.currentA - target) <= defaultCurrentTolerance * target;
}

const keyOf = (c: OverlayCandidate): DischargeKey => ({ runNumber: c.runNumber, stepId: c.stepId, cycle: c.cycle });

/**
 * The preset "one specimen at several currents": every discharge of the specimen (the given one, or
 * the one tested at the most currents), one per current, the latest run's where there are several.
 */
export function pickOneSpecimenAtSeveralCurrents(candidates: readonly OverlayCandidate[], specimenId?: string): DischargeKey[] {
  const bySpecimen = new Map<string, Map<number, OverlayCandidate>>();
  for (const c of candidates) {
    const currents = bySpecimen.get(c.specimenId) ?? new Map<number, OverlayCandidate>();
    const multiple = computeMultipleOfIt(c);
    const kept = [...currents.entries()].find(([m]) => isAtMultiple(c, m));
    if (!kept) currents.set(multiple, c);
    else if (kept[1].runNumber < c.runNumber) currents.set(kept[0], c);
    bySpecimen.set(c.specimenId, currents);
  }
  let chosen = specimenId === undefined ? undefined : bySpecimen.get(specimenId);
  if (!chosen) for (const currents of bySpecimen.values()) if (!chosen || currents.size > chosen.size) chosen = currents;
  return [...(chosen?.values() ?? [])]
    .sort((a, b) => a.currentA - b.currentA)
    .slice(0, MAX_OVERLAID)
    .map(keyOf);
}

/** The preset "several specimens at one current" draws at most this many curves: enough to see the spread, few enough to tell apart. */
export const PRESET_SPECIMENS = 6;

/**
 * The preset "several specimens at one current": one discharge per specimen at the multiple of It
 * (its first in list order), then, ordered by capacity, the lowest, the highest and evenly spaced
 * ones between, at most PRESET_SPECIMENS, so the overlay shows the spread.
 */
export function pickSpecimensAtOneCurrent<T extends OverlayCandidate & { capacityAh: number }>(candidates: readonly T[], multipleOfIt: number): DischargeKey[] {
  const seen = new Set<string>();
  const one: T[] = [];
  for (const c of candidates) {
    if (seen.has(c.specimenId) || !isAtMultiple(c, multipleOfIt)) continue;
    seen.add(c.specimenId);
    one.push(c);
  }
  const byCapacity = one.sort((a, b) => a.capacityAh - b.capacityAh);
  if (byCapacity.length <= PRESET_SPECIMENS) return byCapacity.map(keyOf);
  const step = (byCapacity.length - 1) / (PRESET_SPECIMENS - 1);
  return Array.from({ length: PRESET_SPECIMENS }, (_, k) => keyOf(byCapacity[Math.round(k * step)]!));
}

/** The multiples of It the discharges ran at, lowest first, each within 2 % counted once (rounded to 2 decimals). */
export function listMultiplesOfIt(candidates: readonly Pick<OverlayCandidate, "currentA" | "rating">[]): number[] {
  const multiples = candidates.map(computeMultipleOfIt).sort((a, b) => a - b);
  const kept: number[] = [];
  for (const m of multiples) {
    const last = kept.at(-1);
    if (last === undefined || m - last > defaultCurrentTolerance * last) kept.push(m);
  }
  return kept.map((m) => Math.round(m * 100) / 100);
}
