"use client";

import { useId, type ReactNode } from "react";
import { SelectField } from "@/components/ui/select-field";
import type { MappingDraft } from "@/lib/analysis/log-import";

/** One choice of the mapping: the lab's labelled drop-down, options as [value, words] pairs. */
function MappingChoice({ label, value, options, onChange, testId }: { label: string; value: string; options: [string, string][]; onChange: (v: string) => void; testId?: string }) {
  const id = useId();
  return (
    <SelectField
      id={id}
      label={label}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      data-testid={testId}
      className="text-sm"
      options={options.map(([v, words]) => ({ value: v, label: words }))}
    />
  );
}

function Row({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-wrap items-end gap-3 border-b border-rule pb-3">
      <legend className="mb-1 w-full text-sm font-semibold text-ink-soft">{title}</legend>
      {children}
    </fieldset>
  );
}

/** The operator's confirmation of each column, its unit and the sign of a discharging current. */
export function MappingFields({ columns, draft, onChange }: { columns: string[]; draft: MappingDraft; onChange: (d: MappingDraft) => void }) {
  const pick: [string, string][] = [["", "— choose —"], ...columns.map((c): [string, string] => [c, c])];
  const optional: [string, string][] = [["", "— not in this file —"], ...columns.map((c): [string, string] => [c, c])];
  const timeForm = draft.time?.form === "timestamp" ? "timestamp" : (draft.time?.unit ?? "s");
  const set = (patch: Partial<MappingDraft>) => onChange({ ...draft, ...patch });
  return (
    <div className="flex flex-col gap-3" data-testid="mapping-fields">
      <Row title="Time">
        <MappingChoice label="Time column" testId="map-time" value={draft.time?.column ?? ""} options={pick} onChange={(column) => set({ time: timeForm === "timestamp" ? { form: "timestamp", column } : { form: "elapsed", column, unit: timeForm } })} />
        <MappingChoice
          label="Time is written as"
          testId="map-time-form"
          value={timeForm}
          options={[["s", "elapsed seconds"], ["min", "elapsed minutes"], ["h", "elapsed hours"], ["timestamp", "date and time"]]}
          onChange={(form) => {
            const column = draft.time?.column ?? "";
            set({ time: form === "timestamp" ? { form: "timestamp", column } : { form: "elapsed", column, unit: form as "s" | "min" | "h" } });
          }}
        />
      </Row>
      <Row title="Voltage">
        <MappingChoice label="Voltage column" testId="map-voltage" value={draft.voltage?.column ?? ""} options={pick} onChange={(column) => set({ voltage: { column, unit: draft.voltage?.unit ?? "V" } })} />
        <MappingChoice label="Unit" value={draft.voltage?.unit ?? "V"} options={[["V", "V"], ["mV", "mV"]]} onChange={(unit) => set({ voltage: { column: draft.voltage?.column ?? "", unit: unit as "V" | "mV" } })} />
      </Row>
      <Row title="Current">
        <MappingChoice
          label="Current column"
          testId="map-current"
          value={draft.current?.column ?? ""}
          options={pick}
          onChange={(column) => set({ current: { column, unit: draft.current?.unit ?? "A", dischargeSign: draft.current?.dischargeSign ?? "negative" } })}
        />
        <MappingChoice label="Unit" value={draft.current?.unit ?? "A"} options={[["A", "A"], ["mA", "mA"]]} onChange={(unit) => set({ current: { column: draft.current?.column ?? "", unit: unit as "A" | "mA", dischargeSign: draft.current?.dischargeSign ?? "negative" } })} />
        <MappingChoice
          label="A discharging current is written"
          testId="map-discharge-sign"
          value={draft.current?.dischargeSign ?? "negative"}
          options={[["negative", "as a negative number"], ["positive", "as a positive number"]]}
          onChange={(sign) => set({ current: { column: draft.current?.column ?? "", unit: draft.current?.unit ?? "A", dischargeSign: sign as "negative" | "positive" } })}
        />
      </Row>
      <Row title="Optional columns">
        <MappingChoice label="Temperature (°C)" value={draft.temperature?.column ?? ""} options={optional} onChange={(column) => set({ temperature: column ? { column } : undefined })} />
        <MappingChoice label="Cycler step index" value={draft.step?.column ?? ""} options={optional} onChange={(column) => set({ step: column ? { column } : undefined })} />
        <MappingChoice label="Cycler capacity" value={draft.capacity?.column ?? ""} options={optional} onChange={(column) => set({ capacity: column ? { column, unit: draft.capacity?.unit ?? "Ah" } : undefined })} />
        {draft.capacity && (
          <MappingChoice label="Capacity unit" value={draft.capacity.unit} options={[["Ah", "Ah"], ["mAh", "mAh"]]} onChange={(unit) => set({ capacity: { column: draft.capacity?.column ?? "", unit: unit as "Ah" | "mAh" } })} />
        )}
      </Row>
      <Row title="Layout of the file">
        <MappingChoice label="Cells separated by" value={draft.delimiter} options={[[",", "commas"], [";", "semicolons"], ["\t", "tabs"]]} onChange={(d) => set({ delimiter: d as MappingDraft["delimiter"] })} />
        <MappingChoice label="Decimal mark" value={draft.decimalSeparator} options={[[".", "point (3.7)"], [",", "comma (3,7)"]]} onChange={(d) => set({ decimalSeparator: d as MappingDraft["decimalSeparator"] })} />
        <p className="text-sm text-ink-soft">
          Header on line {draft.headerLine}
          {draft.dataStartLine ? `, data from line ${draft.dataStartLine}` : ""}
        </p>
      </Row>
    </div>
  );
}
