import type { Metadata } from "next";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { countOutbox, listOutbox } from "@/db/mail-messages";
import { requirePageAccess } from "@/lib/auth/guards";
import { getMailCatcherUrl, readCatcherInbox } from "@/lib/mail/read-catcher-inbox";
import { MAX_SEND_ATTEMPTS } from "@/lib/mail/retry-backoff";
import { CatcherInbox } from "./catcher-inbox";
import { MailSettingsNote } from "./mail-settings-note";
import { OutboxTable } from "./outbox-table";

export const metadata: Metadata = { title: "E-mail" };

const OUTBOX_SHOWN = 100;

export default async function MailPage() {
  await requirePageAccess("/admin/mail");
  const catcherUrl = getMailCatcherUrl();
  const [messages, counts, inbox] = await Promise.all([
    listOutbox(getDb(), { limit: OUTBOX_SHOWN }),
    countOutbox(getDb(), MAX_SEND_ATTEMPTS),
    catcherUrl ? readCatcherInbox(catcherUrl) : Promise.resolve(null),
  ]);
  return (
    <>
      <PageHeader
        title="E-mail"
        lead="The notices the workbench sends: run submitted (to the engineers), run returned (to its operator), certificate issued (to the auditors) and calibration due (to the admins). Each is written with the change that causes it and sent afterwards; a failed send is tried again and never undoes the change."
        actions={
          <a href="/admin/mail" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
            Refresh
          </a>
        }
      />
      <MailSettingsNote catcherUrl={catcherUrl} />
      <section aria-labelledby="outbox" className="mb-10 mt-6">
        <h2 id="outbox" className="text-lg font-bold">
          Outbox
        </h2>
        <p className="mb-3 text-sm text-ink-soft" data-testid="outbox-counts">
          {counts.sent} sent, {counts.waiting} waiting, {counts.gaveUp} given up
          {counts.sent + counts.waiting + counts.gaveUp > OUTBOX_SHOWN ? ` — the newest ${OUTBOX_SHOWN} shown` : ""}. Times in UTC.
        </p>
        <OutboxTable messages={messages} />
      </section>
      {catcherUrl && inbox && (
        <section aria-labelledby="catcher">
          <h2 id="catcher" className="text-lg font-bold">
            Arrived at the local mail catcher
          </h2>
          {inbox.ok ? (
            <CatcherInbox messages={inbox.messages} />
          ) : (
            <Notice tone="problem" title="The local mail catcher did not answer">
              {catcherUrl} — {inbox.error}. Messages that fail to send stay in the outbox and are tried again.
            </Notice>
          )}
        </section>
      )}
    </>
  );
}
