import { Notice } from "@/components/ui/notice";
import { isLoopbackHost, readMailSettings, type MailSettings } from "@/lib/mail/transport";

function readSettings(): { settings: MailSettings | null; error: string | null } {
  try {
    return { settings: readMailSettings(), error: null };
  } catch (error) {
    return { settings: null, error: error instanceof Error ? error.message : String(error) };
  }
}

/** Where mail goes from this server, and what the local catcher is. */
export function MailSettingsNote({ catcherUrl }: { catcherUrl: string | null }) {
  const { settings, error } = readSettings();
  if (error) {
    return (
      <Notice tone="problem" title="The mail settings are wrong">
        {error}. Nothing is sent until they are corrected; messages wait in the outbox.
      </Notice>
    );
  }
  if (!settings) {
    return (
      <Notice tone="caution" title="No mail server set">
        SMTP_HOST is not set on this server, so nothing is sent: messages wait in the outbox. Set SMTP_HOST, SMTP_PORT and MAIL_FROM to your lab&apos;s
        mail server (and SMTP_USER, SMTP_PASSWORD if it asks for a sign-in), then restart the app.
      </Notice>
    );
  }
  const local = isLoopbackHost(settings.host);
  return (
    <Notice tone="info" title={local ? "Mail goes to a local stand-in" : "Mail goes to the lab's mail server"}>
      <p data-testid="mail-route">
        Sent through {settings.host}:{settings.port} as {settings.from}
        {local ? " (this machine)" : settings.secure ? " over TLS" : " with STARTTLS required"}.
      </p>
      {local && (
        <p className="mt-1">
          {catcherUrl ? "The local mail catcher" : "A server on this machine"} keeps the messages here and delivers nothing to anyone&apos;s mailbox: it is a
          stand-in for the demo and the tests. A real lab sets SMTP_HOST (with SMTP_PORT, MAIL_FROM, and SMTP_USER, SMTP_PASSWORD if its server asks for a
          sign-in) to its own mail server.
        </p>
      )}
    </Notice>
  );
}
