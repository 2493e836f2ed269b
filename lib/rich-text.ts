import { z } from "zod";

/**
 * Rich text (instructions, safety cautions) is kept as a ProseMirror document from the editor, never
 * as HTML, so nothing a browser would execute is ever stored or echoed back.
 */
export interface RichTextNode {
  type: string;
  text?: string;
  attrs?: Record<string, unknown>;
  marks?: { type: string; attrs?: Record<string, unknown> }[];
  content?: RichTextNode[];
}

const nodeSchema: z.ZodType<RichTextNode> = z.lazy(() =>
  z.object({
    type: z.string().max(40),
    text: z.string().max(20_000).optional(),
    attrs: z.record(z.string(), z.unknown()).optional(),
    marks: z.array(z.object({ type: z.string().max(40), attrs: z.record(z.string(), z.unknown()).optional() })).optional(),
    content: z.array(nodeSchema).optional(),
  }),
);

const MAX_JSON_CHARS = 100_000;

export const richTextDocSchema = z
  .object({ type: z.literal("doc"), content: z.array(nodeSchema).optional() })
  .refine((doc) => JSON.stringify(doc).length <= MAX_JSON_CHARS, { message: "The text is too long (at most about 100 000 characters)." })
  .nullable();
export type RichTextDoc = z.infer<typeof richTextDocSchema>;

/** Plain text of a document, paragraphs separated by blank lines (for search, PDFs and e-mail). */
export function richTextToPlain(doc: RichTextDoc | undefined): string {
  if (!doc) return "";
  const blocks: string[] = [];
  const walk = (node: RichTextNode, into: string[]) => {
    if (node.text) into.push(node.text);
    for (const child of node.content ?? []) walk(child, into);
  };
  for (const block of doc.content ?? []) {
    const parts: string[] = [];
    walk(block, parts);
    const text = parts.join("").trim();
    if (text) blocks.push(text);
  }
  return blocks.join("\n\n");
}

/** A document holding one paragraph per line of plain text: for seeds and templates. */
export function plainToRichText(text: string): RichTextDoc {
  const paragraphs = text.split(/\n{2,}/).map((p) => p.trim()).filter(Boolean);
  return {
    type: "doc",
    content: paragraphs.map((p) => ({ type: "paragraph", content: [{ type: "text", text: p }] })),
  };
}
