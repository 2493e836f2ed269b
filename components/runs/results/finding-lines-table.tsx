import type { FindingOutcome } from "@/lib/conformance";
import type { FindingLine } from "@/lib/runs/group-findings";

const OUTCOME: Record<FindingOutcome, { words: string; mark: string; tone: string }> = {
  meets: { words: "meets", mark: "✓", tone: "text-meets" },
  deviates: { words: "deviates", mark: "✕", tone: "text-deviates" },
  "not assessable": { words: "not assessable", mark: "?", tone: "text-ink-soft" },
};

/** The findings of one step (or of the run as a whole): drawn on the server for an open group, in the browser for one opened later. */
export function FindingLinesTable({ lines }: { lines: FindingLine[] }) {
  return (
    <table className="w-full border-collapse text-sm">
      <thead>
        <tr className="border-b border-rule text-left">
          <th scope="col" className="px-2 py-1 font-semibold">
            Check
          </th>
          <th scope="col" className="px-2 py-1 font-semibold">
            Outcome
          </th>
          <th scope="col" className="px-2 py-1 font-semibold">
            Expected
          </th>
          <th scope="col" className="px-2 py-1 font-semibold">
            Observed
          </th>
          <th scope="col" className="px-2 py-1 font-semibold">
            Clause
          </th>
        </tr>
      </thead>
      <tbody>
        {lines.map((f) => (
          <tr key={f.id} className="border-b border-rule align-top">
            <td className="px-2 py-1">{f.title}</td>
            <td className="px-2 py-1">
              <FindingOutcomeWords line={f} />
            </td>
            <td className="px-2 py-1">{f.expected}</td>
            <td className="px-2 py-1">{f.observed}</td>
            <td className="px-2 py-1">{f.clause}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function FindingOutcomeWords({ line }: { line: FindingLine }) {
  // A step run outside the cell's rating is never shown as a plain "meets": it ran there by acknowledgement.
  if (line.beyondRating && line.outcome === "meets") {
    return (
      <span className="font-medium text-copper-deep" data-testid="outside-rating">
        <span aria-hidden="true">⚠ </span>outside the rating, acknowledged (safety)
      </span>
    );
  }
  const o = OUTCOME[line.outcome];
  return (
    <span className={o.tone}>
      <span aria-hidden="true">{o.mark} </span>
      {o.words}
      {line.safety ? " (safety)" : ""}
    </span>
  );
}
