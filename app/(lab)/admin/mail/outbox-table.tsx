import clsx from "clsx";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
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
    <Table>
      <TableHead>
        <HeaderCell>Queued</HeaderCell>
        <HeaderCell>Notice</HeaderCell>
        <HeaderCell>To</HeaderCell>
        <HeaderCell>State</HeaderCell>
      </TableHead>
      <tbody>
        {messages.map((m) => {
          const state = classifyMailState(m);
          return (
            <Row key={m.id} data-testid="outbox-message" data-state={state} top>
              <Cell>
                <Moment at={m.createdAt} />
              </Cell>
              <Cell>
                <span className="block text-xs uppercase tracking-wide text-ink-soft">{MAIL_KIND_LABELS[m.kind]}</span>
                <MessageText subject={m.subject} text={m.body} />
              </Cell>
              <Cell>
                <AddressList addresses={m.recipients} />
              </Cell>
              <td className={clsx("py-2", STATE_MARK[state].tone)}>
                <span aria-hidden="true">{STATE_MARK[state].mark} </span>
                {describeMailState(m, formatDateTime)}
                {m.lastError && state !== "sent" && <span className="mt-1 block text-xs text-ink [overflow-wrap:anywhere]">Last error: {m.lastError}</span>}
              </td>
            </Row>
          );
        })}
      </tbody>
    </Table>
  );
}
