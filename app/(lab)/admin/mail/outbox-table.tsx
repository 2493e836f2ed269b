import clsx from "clsx";
import type { OutboxMessage } from "@/db/mail-messages";
import { classifyMailState, describeMailState, MAIL_KIND_LABELS, type MailState } from "@/lib/mail/describe-mail-state";
import { formatDateTime } from "@/lib/format-date-time";
import { AddressList, MessageText, Moment } from "./mail-parts";

const STATE_MARK: Record<MailState, { mark: string; tone: string }> = {
  sent: { mark: "✓", tone: "text-meets" },
  waiting: { mark: "…", tone: "text-ink-soft" },
  retrying: { mark: "↻", tone: "text-copper-deep" },
  "gave-up": { mark: "✕", tone: "text-deviates" },
};

export function OutboxTable({ messages }: { messages: OutboxMessage[] }) {
  if (messages.length === 0) return <p className="py-4 text-ink-soft">Nothing has been queued yet.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            <th className="py-2 pr-3">Queued</th>
            <th className="py-2 pr-3">Notice</th>
            <th className="py-2 pr-3">To</th>
            <th className="py-2">State</th>
          </tr>
        </thead>
        <tbody>
          {messages.map((m) => {
            const state = classifyMailState(m);
            return (
              <tr key={m.id} className="border-b border-rule align-top" data-testid="outbox-message" data-state={state}>
                <td className="py-2 pr-3">
                  <Moment at={m.createdAt} />
                </td>
                <td className="py-2 pr-3">
                  <span className="block text-xs uppercase tracking-wide text-ink-soft">{MAIL_KIND_LABELS[m.kind]}</span>
                  <MessageText subject={m.subject} text={m.body} />
                </td>
                <td className="py-2 pr-3">
                  <AddressList addresses={m.recipients} />
                </td>
                <td className={clsx("py-2", STATE_MARK[state].tone)}>
                  <span aria-hidden="true">{STATE_MARK[state].mark} </span>
                  {describeMailState(m, formatDateTime)}
                  {m.lastError && state !== "sent" && <span className="mt-1 block text-xs text-ink [overflow-wrap:anywhere]">Last error: {m.lastError}</span>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
