import type { ChangeEvent } from "react";
import { SelectField } from "@/components/ui/select-field";
import type { SpecificationOption } from "@/lib/specimens/form-option-types";

export type { SpecificationOption };

/** The cell specification a lot or a specimen is of. Controlled when `value` is given. */
export function SpecificationSelect({
  specifications,
  defaultValue,
  value,
  onChange,
  errors,
}: {
  specifications: SpecificationOption[];
  defaultValue?: string;
  value?: string;
  onChange?: (id: string) => void;
  errors?: string[];
}) {
  const controlled = value !== undefined ? { value, onChange: (e: ChangeEvent<HTMLSelectElement>) => onChange?.(e.target.value) } : { defaultValue: defaultValue ?? "" };
  return (
    <SelectField label="Cell specification" name="cellSpecificationId" errors={errors} {...controlled}>
      <option value="">choose…</option>
      {specifications.map((s) => (
        <option key={s.id} value={s.id}>
          {s.label}
        </option>
      ))}
    </SelectField>
  );
}
