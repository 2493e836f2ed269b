import type { CaughtMail } from "@/lib/mail/read-catcher-inbox";
import { AddressList, MessageText, Moment } from "./mail-parts";

export function CatcherInbox({ messages }: { messages: CaughtMail[] }) {
  if (messages.length === 0) return <p className="py-4 text-ink-soft">Nothing has arrived at the catcher yet.</p>;
  return (
    <div className="overflow-x-auto">
      <p className="mb-3 text-sm text-ink-soft">Newest first; open a subject to read the message as it arrived.</p>
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            <th className="py-2 pr-3">Arrived</th>
            <th className="py-2 pr-3">Message</th>
            <th className="py-2">Delivered to</th>
          </tr>
        </thead>
        <tbody>
          {messages.map((m) => (
            <tr key={m.id} className="border-b border-rule align-top" data-testid="caught-message">
              <td className="py-2 pr-3">
                <Moment at={m.receivedAt} />
              </td>
              <td className="py-2 pr-3">
                <MessageText subject={m.subject} text={m.text} note={`From ${m.from}`} />
              </td>
              <td className="py-2">
                <AddressList addresses={m.to} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
