"use client";

import { useQuery } from "@tanstack/react-query";
import { getJson } from "./post-json";
import { Select } from "@/components/ui/select-field";

interface SpecificationOption {
  id: string;
  maker: string;
  model: string;
  designation: string;
}

/** "maker model (designation)", the way a cell type is named across the workbench. */
export function nameSpecification(spec: Omit<SpecificationOption, "id">): string {
  return `${spec.maker} ${spec.model} (${spec.designation})`;
}

/** Chooses the cell specification a procedure is resolved against. */
export function SpecPicker({ id, value, onChange }: { id: string; value: string | null; onChange: (specId: string | null) => void }) {
  const specs = useQuery({
    queryKey: ["specifications"],
    queryFn: ({ signal }) => getJson<{ specifications: SpecificationOption[] }>("/api/specs", signal),
  });
  const options = specs.data?.specifications ?? [];
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium">
        Cell specification
      </label>
      <Select
        id={id}
        value={value ?? ""}
        onChange={(event) => onChange(event.target.value || null)}
        disabled={specs.isPending}
        aria-describedby={`${id}-status`}
        className="max-w-full sm:w-96"
        options={[
          { value: "", label: specs.isPending ? "Loading the cell specifications…" : "Choose a cell specification…" },
          ...options.map((spec) => ({ value: spec.id, label: nameSpecification(spec) })),
        ]}
      />
      <p id={`${id}-status`} className="text-xs text-ink-soft" aria-live="polite">
        {specs.isError
          ? `The cell specifications could not be loaded: ${specs.error.message}`
          : specs.isSuccess && options.length === 0
            ? "No cell specification is recorded yet; add one under Cell specifications."
            : "Set-points are worked out for the chosen cell from its datasheet values."}
      </p>
    </div>
  );
}
