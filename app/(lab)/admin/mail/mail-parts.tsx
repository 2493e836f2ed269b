import { formatDateTime } from "@/lib/format-date-time";

/** A moment that may wrap between its date and its time, never inside either. */
export function Moment({ at }: { at: Date | string }) {
  const [date, ...time] = formatDateTime(at).split(" ");
  return (
    <span className="figures">
      <span className="whitespace-nowrap">{date}</span> <span className="whitespace-nowrap">{time.join(" ")}</span>
    </span>
  );
}

/** Addresses one per line; a long one may break after its @, nowhere else. */
export function AddressList({ addresses }: { addresses: readonly string[] }) {
  return (
    <ul className="space-y-1">
      {addresses.map((a) => {
        const at = a.lastIndexOf("@");
        return (
          <li key={a}>
            {at > 0 ? (
              <>
                {a.slice(0, at + 1)}
                <wbr />
                {a.slice(at + 1)}
              </>
            ) : (
              a
            )}
          </li>
        );
      })}
    </ul>
  );
}

/** The subject, opening on click to the message's text as sent. */
export function MessageText({ subject, text, note }: { subject: string; text: string; note?: string }) {
  return (
    <details>
      <summary className="cursor-pointer">{subject || "(no subject)"}</summary>
      {note && <p className="mt-2 text-xs text-ink-soft">{note}</p>}
      <pre className="mt-2 whitespace-pre-wrap rounded bg-paper-deep p-3 font-sans text-xs [overflow-wrap:anywhere]">{text}</pre>
    </details>
  );
}
