import { z } from "zod";

/** Rows on one page of every list. */
export const PAGE_SIZE = 25;

/** Rows on one page of a JSON list (`/api/runs`, `/api/certificates`): `?page=` reads the next. */
export const API_PAGE_SIZE = 100;

export type SortDirection = "asc" | "desc";

/** What a list page reads from its address: which page, sorted by which column, which way. */
export interface ListParams<S extends string> {
  page: number;
  sort: S;
  direction: SortDirection;
}

export type RawSearchParams = Record<string, string | string[] | undefined>;

/** A repeated parameter (`?page=2&page=3`) counts by its first value, as a browser form would send it. */
function first(value: string | string[] | undefined): string | undefined {
  return Array.isArray(value) ? value[0] : value;
}

/**
 * Reads `page`, `sort` and `dir` from the address. Anything it does not know falls back to the list's
 * default: an unknown column sorts by the default column in its default direction, a page that is not
 * a whole number ≥ 1 is page 1 (a page past the end is clamped once the count is known).
 */
export function parseListParams<S extends string>(
  raw: RawSearchParams,
  options: { sorts: readonly [S, ...S[]]; defaultSort: S; defaultDirection?: SortDirection },
): ListParams<S> {
  const defaultDirection = options.defaultDirection ?? "asc";
  const sort = z.enum(options.sorts).safeParse(first(raw.sort));
  const direction = z.enum(["asc", "desc"]).safeParse(first(raw.dir));
  const page = parsePageNumber(raw);
  if (!sort.success) return { page, sort: options.defaultSort, direction: defaultDirection };
  return {
    page,
    sort: sort.data as S,
    direction: direction.success ? direction.data : defaultDirection,
  };
}

/**
 * The page number in `raw[param]`: a whole number ≥ 1, else page 1 (a page past the end is clamped once
 * the count is known). A page with several lists gives each its own parameter.
 */
export function parsePageNumber(raw: RawSearchParams, param = "page"): number {
  const page = z.coerce.number().int().min(1).max(1_000_000).safeParse(first(raw[param]));
  return page.success ? page.data : 1;
}

/** The current address's plain parameters (first value of each, empty ones dropped), to keep filters in links. */
export function keptParams(raw: RawSearchParams): Record<string, string> {
  const kept: Record<string, string> = {};
  for (const [key, value] of Object.entries(raw)) {
    const v = first(value);
    if (v !== undefined && v !== "") kept[key] = v;
  }
  return kept;
}

/** An address on `path` with the kept parameters changed by `changes` (undefined removes one). */
export function listHref(path: string, kept: Record<string, string>, changes: Record<string, string | number | undefined>): string {
  const params = new URLSearchParams(kept);
  for (const [key, value] of Object.entries(changes)) {
    if (value === undefined) params.delete(key);
    else params.set(key, String(value));
  }
  const query = params.toString();
  return query ? `${path}?${query}` : path;
}
