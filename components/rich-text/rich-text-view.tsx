import type { ReactNode } from "react";
import type { RichTextDoc, RichTextNode } from "@/lib/rich-text";

/**
 * Renders a stored rich-text document as React elements, node by node. Only known node and mark
 * types become markup; anything else shows as its plain text. No HTML string is ever injected.
 */
export function RichTextView({ doc, empty = "—" }: { doc: RichTextDoc | undefined; empty?: string }) {
  if (!doc?.content?.length) return <p className="text-ink-soft">{empty}</p>;
  return <div className="flex flex-col gap-2 leading-relaxed">{doc.content.map((n, i) => renderNode(n, i))}</div>;
}

function renderChildren(node: RichTextNode): ReactNode {
  return node.content?.map((c, i) => renderNode(c, i));
}

function renderNode(node: RichTextNode, key: number): ReactNode {
  switch (node.type) {
    case "paragraph":
      return <p key={key}>{renderChildren(node)}</p>;
    case "heading": {
      const level = Number(node.attrs?.level ?? 3);
      return level <= 2 ? (
        <h3 key={key} className="font-serif text-lg font-bold">
          {renderChildren(node)}
        </h3>
      ) : (
        <h4 key={key} className="font-bold">
          {renderChildren(node)}
        </h4>
      );
    }
    case "bulletList":
      return (
        <ul key={key} className="list-disc pl-6">
          {renderChildren(node)}
        </ul>
      );
    case "orderedList":
      return (
        <ol key={key} className="list-decimal pl-6">
          {renderChildren(node)}
        </ol>
      );
    case "listItem":
      return <li key={key}>{renderChildren(node)}</li>;
    case "blockquote":
      return (
        <blockquote key={key} className="border-l-4 border-rule pl-3">
          {renderChildren(node)}
        </blockquote>
      );
    case "hardBreak":
      return <br key={key} />;
    case "horizontalRule":
      return <hr key={key} className="border-rule" />;
    case "text":
      return renderText(node, key);
    default:
      return <span key={key}>{renderChildren(node)}</span>;
  }
}

function renderText(node: RichTextNode, key: number): ReactNode {
  let out: ReactNode = node.text ?? "";
  for (const mark of node.marks ?? []) {
    if (mark.type === "bold") out = <strong>{out}</strong>;
    else if (mark.type === "italic") out = <em>{out}</em>;
    else if (mark.type === "code") out = <code className="rounded bg-paper-deep px-1">{out}</code>;
    else if (mark.type === "strike") out = <s>{out}</s>;
  }
  return <span key={key}>{out}</span>;
}
