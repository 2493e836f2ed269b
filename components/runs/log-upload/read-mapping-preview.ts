import type { LogColumns } from "@/lib/analysis";
import { columnMappingSchema, createLogParser, type ColumnMapping, type LogImportError } from "@/lib/analysis/log-import";

export type MappingPreview = { ok: true; columns: LogColumns; rows: number } | { ok: false; error: LogImportError };

/**
 * The first bytes of a file read with the operator's mapping, as the server will read the whole file:
 * only whole lines (the cut tail is dropped unless the bytes are the whole file).
 */
export function readMappingPreview(head: Uint8Array, draft: unknown, isWholeFile: boolean): MappingPreview {
  const checked = columnMappingSchema.safeParse(draft);
  if (!checked.success) {
    return { ok: false, error: { code: "invalid-mapping", message: checked.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ") } };
  }
  const mapping: ColumnMapping = checked.data;
  const end = isWholeFile ? head.length : head.lastIndexOf(0x0a) + 1;
  const parser = createLogParser(mapping, { maxBytes: Number.MAX_SAFE_INTEGER });
  const refused = parser.push(head.subarray(0, end));
  if (refused) return { ok: false, error: refused };
  const parsed = parser.finish();
  return parsed.ok ? { ok: true, columns: parsed.columns, rows: parsed.rows } : { ok: false, error: parsed.error };
}
