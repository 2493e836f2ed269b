import type { Metadata } from "next";
import { getDb } from "@/db";
import { listInstruments } from "@/db/instruments";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { requirePageAccess } from "@/lib/auth/guards";
import { formatDate, formatDateTime } from "@/lib/format-date-time";
import { listTokens } from "@/lib/machine-tokens/token-admin";
import { TOKEN_DEFAULT_DAYS, TOKEN_MAX_DAYS, TOKEN_REQUESTS_PER_MINUTE } from "@/lib/machine-tokens/token-policy";
import { IssueTokenForm } from "./issue-token-form";
import { RevokeTokenForm } from "./revoke-token-form";

export const metadata: Metadata = { title: "Cycler tokens" };

export default async function CyclerTokensPage() {
  await requirePageAccess("/admin/cycler-tokens");
  const [tokens, channels] = await Promise.all([listTokens(), listInstruments(getDb(), { kind: "cycler-channel", inUseOnly: true })]);
  return (
    <>
      <PageHeader
        title="Cycler tokens"
        lead={`A cycler PC sends its data log to a run, part by part, with a token issued here for one cycler channel (the push command, see docs/push-log.md). A token may add log parts to open runs that use its channel, and nothing else. It is shown once when issued; only a fingerprint of it is kept. Tokens expire (${TOKEN_DEFAULT_DAYS} days unless you choose otherwise, at most ${TOKEN_MAX_DAYS}) and are limited to ${TOKEN_REQUESTS_PER_MINUTE} requests a minute.`}
      />
      <div className="mb-6">
        <Notice tone="caution" title="Read-only upload">
          Pushing a log never controls the cycler: a token cannot start, stop or change a test. Setting up, starting and watching the cycler
          stays with the operator, under the lab&apos;s own safety rules for charging and discharging cells.
        </Notice>
      </div>
      <section aria-labelledby="issue" className="mb-8">
        <h2 id="issue" className="mb-2 text-lg font-bold">
          Issue a token
        </h2>
        {channels.length === 0 ? (
          <p className="text-sm text-ink-soft">No cycler channel is in use. Add one in the instrument register first.</p>
        ) : (
          <IssueTokenForm channels={channels.map((c) => ({ value: c.id, label: `${c.identifier} (serial ${c.serial})` }))} defaultDays={TOKEN_DEFAULT_DAYS} maxDays={TOKEN_MAX_DAYS} />
        )}
      </section>
      <section aria-labelledby="tokens">
        <h2 id="tokens" className="mb-2 text-lg font-bold">
          Tokens issued
        </h2>
        {tokens.length === 0 ? (
          <EmptyState>No token has been issued yet.</EmptyState>
        ) : (
          <Table data-testid="cycler-tokens">
            <TableHead>
              <HeaderCell>Label</HeaderCell>
              <HeaderCell>Channel</HeaderCell>
              <HeaderCell>Begins with</HeaderCell>
              <HeaderCell>Issued</HeaderCell>
              <HeaderCell>Expires</HeaderCell>
              <HeaderCell>Last used</HeaderCell>
              <HeaderCell>State</HeaderCell>
            </TableHead>
            <tbody>
              {tokens.map((t) => {
                return (
                  <Row key={t.id} top>
                    <Cell>{t.label}</Cell>
                    <Cell>{t.instrument.identifier}</Cell>
                    <Cell className="font-mono text-xs">{t.hint}…</Cell>
                    <Cell>
                      {formatDateTime(t.issuedAt)}
                      <br />
                      <span className="text-ink-soft">by {t.issuedBy}</span>
                    </Cell>
                    <Cell className="tabular-nums">{formatDate(t.expiresAt)}</Cell>
                    <Cell className="tabular-nums">{t.lastUsedAt ? formatDateTime(t.lastUsedAt) : "never"}</Cell>
                    <Cell>
                      {t.revokedAt ? (
                        <>
                          Revoked {formatDateTime(t.revokedAt)} by {t.revokedBy}: {t.revokeReason}
                        </>
                      ) : t.state === "expired" ? (
                        "Expired"
                      ) : (
                        <RevokeTokenForm tokenId={t.id} label={t.label} />
                      )}
                    </Cell>
                  </Row>
                );
              })}
            </tbody>
          </Table>
        )}
      </section>
    </>
  );
}
