"use client";

import dynamic from "next/dynamic";
import { useState } from "react";
import { useFormContext } from "react-hook-form";
import type { RichTextDoc } from "@/lib/rich-text";
import { AcknowledgementsList } from "./acknowledgements-list";
import { fieldId } from "./field-paths";
import { useSubtreeErrors, useUpdateDraft } from "./use-draft-field";

// Tiptap and ProseMirror are the largest part of the editor page's scripts: they load on their own, after
// the step fields are usable (docs/decisions/fast-pages.md).
const RichTextEditor = dynamic(() => import("@/components/rich-text/rich-text-editor").then((m) => m.RichTextEditor), {
  ssr: false,
  loading: () => (
    <p role="status" className="rounded border border-rule bg-paper-deep px-3 py-2 text-sm text-ink-soft">
      Loading the text editor…
    </p>
  ),
});

/** The procedure's rich-text instructions and safety cautions, and the acknowledged cautions. */
export function RichTextFields() {
  const { getValues } = useFormContext();
  const update = useUpdateDraft();
  // Tiptap owns the document once it starts; the form only hears its changes.
  const [initial] = useState(() => ({
    instructions: getValues("instructions") as RichTextDoc | undefined,
    cautions: getValues("cautions") as RichTextDoc | undefined,
  }));
  const instructionErrors = useSubtreeErrors("instructions").map((p) => p.message);
  const cautionErrors = useSubtreeErrors("cautions").map((p) => p.message);
  return (
    <section aria-labelledby="texts-heading" className="flex flex-col gap-4">
      <h2 id="texts-heading" className="text-lg font-bold">
        Instructions and safety cautions
      </h2>
      <RichTextEditor
        id={fieldId("instructions")}
        label="Instructions"
        hint="How to set up and run the test: fixtures, connections, what the operator records."
        value={initial.instructions}
        onChange={(doc) => update("instructions", doc)}
        errors={instructionErrors}
      />
      <RichTextEditor
        id={fieldId("cautions")}
        label="Safety cautions"
        hint="What keeps people safe: limits never to exceed, the enclosure, when to stop."
        value={initial.cautions}
        onChange={(doc) => update("cautions", doc)}
        errors={cautionErrors}
      />
      <AcknowledgementsList />
    </section>
  );
}
