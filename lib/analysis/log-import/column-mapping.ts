import { z } from "zod";

/**
 * How one cycler's CSV log maps onto LogColumns, as the operator confirms it. Columns are named by
 * their header text (not their position), so a mapping saved for an instrument still fits when its
 * next export adds or reorders columns. Pure data: it can be stored as JSON and parsed back.
 */

const columnName = z
  .string({ error: "a column is named by its header text" })
  .trim()
  .min(1, { error: "choose a column" })
  .max(200, { error: "a column name has at most 200 characters" });

export const elapsedTimeUnits = ["s", "min", "h"] as const;
export type ElapsedTimeUnit = (typeof elapsedTimeUnits)[number];

/** Elapsed time in a unit, or wall-clock timestamps (ISO 8601, or `YYYY-MM-DD HH:MM:SS`). */
export const timeColumnSchema = z.discriminatedUnion("form", [
  z.strictObject({ form: z.literal("elapsed"), column: columnName, unit: z.enum(elapsedTimeUnits) }),
  z.strictObject({ form: z.literal("timestamp"), column: columnName }),
]);

export const voltageColumnSchema = z.strictObject({ column: columnName, unit: z.enum(["V", "mV"]) });

export const currentColumnSchema = z.strictObject({
  column: columnName,
  unit: z.enum(["A", "mA"]),
  /** How the file writes a discharging current: as a negative number, or as a positive one. */
  dischargeSign: z.enum(["negative", "positive"]),
});

export const plainColumnSchema = z.strictObject({ column: columnName });

/** The cycler's own capacity count: kept beside the log for cross-checking, never used to compute. */
export const capacityColumnSchema = z.strictObject({ column: columnName, unit: z.enum(["Ah", "mAh"]) });

export const logDelimiters = [",", ";", "\t"] as const;
export type LogDelimiter = (typeof logDelimiters)[number];
export type DecimalSeparator = "." | ",";

const lineNumber = z
  .number({ error: "a line number is a whole number" })
  .int({ error: "a line number is a whole number" })
  .min(1, { error: "lines are counted from 1" })
  .max(10_000, { error: "the header must lie within the first 10 000 lines" });

export const columnMappingSchema = z
  .strictObject({
    time: timeColumnSchema,
    voltage: voltageColumnSchema,
    current: currentColumnSchema,
    temperature: plainColumnSchema.optional(),
    step: plainColumnSchema.optional(),
    capacity: capacityColumnSchema.optional(),
    delimiter: z.enum(logDelimiters),
    decimalSeparator: z.enum([".", ","]),
    /** Line of the header row, counted from 1 as a person counts lines in the file. */
    headerLine: lineNumber,
    /** First line of data; lines between the header and it (a units row, say) are skipped. */
    dataStartLine: lineNumber.optional(),
  })
  .superRefine((mapping, ctx) => {
    if (mapping.delimiter === "," && mapping.decimalSeparator === ",") {
      ctx.addIssue({ code: "custom", path: ["decimalSeparator"], message: "a decimal comma needs a delimiter other than a comma" });
    }
    if (mapping.dataStartLine !== undefined && mapping.dataStartLine <= mapping.headerLine) {
      ctx.addIssue({ code: "custom", path: ["dataStartLine"], message: "data must start after the header line" });
    }
    const seen = new Map<string, string>();
    for (const [role, column] of listMappedColumns(mapping)) {
      const earlier = seen.get(column);
      if (earlier !== undefined) {
        ctx.addIssue({ code: "custom", path: [role, "column"], message: `column "${column}" is already used for ${earlier}` });
      } else {
        seen.set(column, role);
      }
    }
  });

export type ColumnMapping = z.infer<typeof columnMappingSchema>;
export type TimeColumn = z.infer<typeof timeColumnSchema>;

export type MappedRole = "time" | "voltage" | "current" | "temperature" | "step" | "capacity";

/** The columns a mapping uses, by role, in a fixed order (time first). */
export function listMappedColumns(mapping: Pick<ColumnMapping, MappedRole>): [MappedRole, string][] {
  const roles: [MappedRole, { column: string } | undefined][] = [
    ["time", mapping.time],
    ["voltage", mapping.voltage],
    ["current", mapping.current],
    ["temperature", mapping.temperature],
    ["step", mapping.step],
    ["capacity", mapping.capacity],
  ];
  return roles.flatMap(([role, column]) => (column ? [[role, column.column] as [MappedRole, string]] : []));
}

/** Line on which data begins, counted from 1. */
export function getDataStartLine(mapping: Pick<ColumnMapping, "headerLine" | "dataStartLine">): number {
  return mapping.dataStartLine ?? mapping.headerLine + 1;
}
