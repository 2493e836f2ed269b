"use client";

import { splitNotes } from "./draft-values";
import { FieldShell, inputClass } from "./field-shell";
import { useDraftValue, useSubtreeErrors, useTypedText, useUpdateDraft } from "./use-draft-field";

const PATH = "definition.header.notes";
const joinNotes = (notes: string[] | undefined) => (notes ?? []).join("\n");

/** Remarks on the values (e.g. which were recalled and must be checked against the standard), one per line. */
export function NotesInput() {
  const notes = useDraftValue<string[] | undefined>(PATH);
  const update = useUpdateDraft();
  const errors = useSubtreeErrors(PATH).map((p) => p.message);
  const [text, setText] = useTypedText(notes, { format: joinNotes, parse: splitNotes });
  return (
    <FieldShell path={PATH} label="Notes on the values (one per line)" hint="Say which values come from the standard, which are common practice and which still need checking." errors={errors}>
      {(control) => (
        <textarea
          {...control}
          rows={4}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            update(PATH, splitNotes(e.target.value));
          }}
          className={inputClass}
        />
      )}
    </FieldShell>
  );
}
