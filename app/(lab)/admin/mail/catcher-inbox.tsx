import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import type { CaughtMail } from "@/lib/mail/read-catcher-inbox";
import { AddressList, MessageText, Moment } from "./mail-parts";

export function CatcherInbox({ messages }: { messages: CaughtMail[] }) {
  if (messages.length === 0) return <p className="py-4 text-ink-soft">Nothing has arrived at the catcher yet.</p>;
  return (
    <div className="overflow-x-auto">
      <p className="mb-3 text-sm text-ink-soft">Newest first; open a subject to read the message as it arrived.</p>
      <Table>
        <TableHead>
          <HeaderCell>Arrived</HeaderCell>
          <HeaderCell>Message</HeaderCell>
          <HeaderCell>Delivered to</HeaderCell>
        </TableHead>
        <tbody>
          {messages.map((m) => (
            <Row key={m.id} data-testid="caught-message" top>
              <Cell>
                <Moment at={m.receivedAt} />
              </Cell>
              <Cell>
                <MessageText subject={m.subject} text={m.text} note={`From ${m.from}`} />
              </Cell>
              <Cell>
                <AddressList addresses={m.to} />
              </Cell>
            </Row>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
