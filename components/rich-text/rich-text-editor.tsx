"use client";

import { EditorContent, useEditor, useEditorState, type Editor, type JSONContent } from "@tiptap/react";
import { StarterKit } from "@tiptap/starter-kit";
import clsx from "clsx";
import { useEffect, useRef, type ReactNode } from "react";
import type { RichTextDoc } from "@/lib/rich-text";

interface ToolbarAction {
  label: string;
  mark: ReactNode;
  isActive: (editor: Editor) => boolean;
  run: (editor: Editor) => void;
}

const ACTIONS: ToolbarAction[] = [
  { label: "Bold", mark: <b>B</b>, isActive: (e) => e.isActive("bold"), run: (e) => e.chain().focus().toggleBold().run() },
  { label: "Italic", mark: <i>I</i>, isActive: (e) => e.isActive("italic"), run: (e) => e.chain().focus().toggleItalic().run() },
  { label: "Heading", mark: "H", isActive: (e) => e.isActive("heading", { level: 3 }), run: (e) => e.chain().focus().toggleHeading({ level: 3 }).run() },
  { label: "Bulleted list", mark: "•≡", isActive: (e) => e.isActive("bulletList"), run: (e) => e.chain().focus().toggleBulletList().run() },
  { label: "Numbered list", mark: "1.≡", isActive: (e) => e.isActive("orderedList"), run: (e) => e.chain().focus().toggleOrderedList().run() },
];

/**
 * Rich text (instructions, safety cautions) edited with Tiptap and handed on as a ProseMirror JSON
 * document (`editor.getJSON()`), never HTML; an empty editor is `null`.
 */
export function RichTextEditor({
  id,
  label,
  hint,
  value,
  onChange,
  errors,
}: {
  id: string;
  label: string;
  hint?: string;
  value: RichTextDoc | undefined;
  onChange: (doc: RichTextDoc) => void;
  errors?: readonly string[];
}) {
  const labelId = `${id}-label`;
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const onChangeRef = useRef(onChange);
  useEffect(() => {
    onChangeRef.current = onChange;
  }, [onChange]);

  const editor = useEditor({
    immediatelyRender: false,
    // No trailing empty paragraph in the stored document, and no links (the read-only view shows text only).
    extensions: [StarterKit.configure({ trailingNode: false, link: false })],
    content: (value ?? "") as JSONContent | string,
    onUpdate: ({ editor: current }) => onChangeRef.current(current.isEmpty ? null : (current.getJSON() as RichTextDoc)),
  });
  const invalid = Boolean(errors?.length);
  useEffect(() => {
    editor?.setOptions({
      editorProps: {
        attributes: {
          id,
          role: "textbox",
          "aria-multiline": "true",
          "aria-labelledby": labelId,
          "aria-describedby": [hint ? hintId : "", errorId].filter(Boolean).join(" "),
          ...(invalid && { "aria-invalid": "true" }),
          class: "prose-editor min-h-28 px-3 py-2 focus:outline-none [&_h3]:font-serif [&_h3]:font-bold [&_ol]:list-decimal [&_ol]:pl-6 [&_ul]:list-disc [&_ul]:pl-6 [&_p]:my-1",
        },
      },
    });
  }, [editor, id, labelId, hint, hintId, errorId, invalid]);

  return (
    <div className="flex flex-col gap-1">
      <span id={labelId} className="text-sm font-medium" onClick={() => editor?.commands.focus()}>
        {label}
      </span>
      {hint && (
        <p id={hintId} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
      <div
        className={clsx(
          "rounded border bg-white focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-copper",
          invalid ? "border-deviates" : "border-rule",
        )}
      >
        <Toolbar editor={editor} label={label} />
        {editor ? <EditorContent editor={editor} /> : <div className="min-h-28 px-3 py-2 text-ink-soft">Loading the editor…</div>}
      </div>
      <p id={errorId} aria-live="polite" className="text-sm text-deviates">
        {errors?.join(" ")}
      </p>
    </div>
  );
}

function Toolbar({ editor, label }: { editor: Editor | null; label: string }) {
  const active = useEditorState({
    editor,
    selector: ({ editor: current }) => (current ? ACTIONS.map((action) => action.isActive(current)) : ACTIONS.map(() => false)),
  });
  return (
    <div role="toolbar" aria-label={`Formatting of ${label.toLowerCase()}`} className="flex flex-wrap gap-1 border-b border-rule bg-paper px-1 py-1">
      {ACTIONS.map((action, index) => (
        <button
          key={action.label}
          type="button"
          aria-label={action.label}
          title={action.label}
          aria-pressed={active?.[index] ?? false}
          disabled={!editor}
          onClick={() => editor && action.run(editor)}
          className="min-w-8 rounded border border-transparent px-2 py-0.5 text-sm hover:border-copper aria-pressed:border-copper aria-pressed:bg-copper-wash disabled:opacity-60"
        >
          <span aria-hidden="true">{action.mark}</span>
        </button>
      ))}
    </div>
  );
}
