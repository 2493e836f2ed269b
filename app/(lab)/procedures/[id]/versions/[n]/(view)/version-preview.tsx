import { ProcedurePreview } from "@/components/procedure-preview";

/** The set-points this version gives for a chosen cell, resolved on the server. */
export function VersionPreview({ procedureId, number }: { procedureId: string; number: number }) {
  return (
    <section aria-labelledby="preview" className="mt-8">
      <h2 id="preview" className="mb-2 text-lg font-bold">
        Set-points for a cell
      </h2>
      <ProcedurePreview source={{ kind: "version", procedureId, number }} />
    </section>
  );
}
