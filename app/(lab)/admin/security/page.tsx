import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { requirePageAccess } from "@/lib/auth/guards";
import { SIGN_IN_LIMITS } from "@/lib/auth/sign-in";
import { listRefusedRequests, listSignInLimits } from "@/lib/auth/sign-in-limits";
import { formatDateTime } from "@/lib/format-date-time";
import { ClearLimitButton } from "./clear-limit-button";

export const metadata: Metadata = { title: "Sign-in security" };

export default async function SignInSecurityPage() {
  await requirePageAccess("/admin/security");
  const limits = await listSignInLimits();
  const refused = await listRefusedRequests();
  const rows = [
    ...limits.pairs.map((g) => ({ ...g, what: `This account from this address is refused (${SIGN_IN_LIMITS.perAccountAndAddress} or more failures).` })),
    ...limits.addresses.map((g) => ({ ...g, what: `This address is refused for every account (${SIGN_IN_LIMITS.perAddress} or more failures).` })),
    ...limits.accounts.map((g) => ({ ...g, what: "This account is slowed down from every address (it is never locked)." })),
  ];
  return (
    <>
      <PageHeader
        title="Sign-in security"
        lead={`Failed sign-ins in the last ${SIGN_IN_LIMITS.windowMinutes} minutes that slow down or refuse someone, and requests refused because they came from another site. Clearing a limit lets the person try again at once; it is recorded in the audit trail.`}
      />
      <section aria-labelledby="limits" className="mb-8">
        <h2 id="limits" className="mb-2 text-lg font-bold">
          Sign-in limits in force
        </h2>
        {rows.length === 0 ? (
          <p className="text-sm text-ink-soft">None: nobody is slowed down or refused.</p>
        ) : (
          <Table data-testid="sign-in-limits">
            <TableHead>
              <HeaderCell>Account</HeaderCell>
              <HeaderCell>Address</HeaderCell>
              <HeaderCell>Failures</HeaderCell>
              <HeaderCell>Last</HeaderCell>
              <HeaderCell>Effect</HeaderCell>
              <HeaderCell>Clear</HeaderCell>
            </TableHead>
            <tbody>
              {rows.map((r) => (
                <Row key={`${r.email}|${r.address}`} top>
                  <Cell>{r.email ?? "any"}</Cell>
                  <Cell>{r.address ?? "any"}</Cell>
                  <Cell className="tabular-nums">{r.failures}</Cell>
                  <Cell className="tabular-nums">{formatDateTime(r.lastAt)}</Cell>
                  <Cell>{r.what}</Cell>
                  <Cell>
                    <ClearLimitButton email={r.email} address={r.address} />
                  </Cell>
                </Row>
              ))}
            </tbody>
          </Table>
        )}
      </section>
      <section aria-labelledby="refused">
        <h2 id="refused" className="mb-2 text-lg font-bold">
          Requests refused (last 24 hours)
        </h2>
        <p className="mb-2 text-sm text-ink-soft">
          Writes from other sites, and cycler uploads with an unknown token. Counted per 10 minutes and origin (or address); the first of each is in
          the audit trail. The origin is as the caller sent it, cut to 200 characters.
        </p>
        {refused.length === 0 ? (
          <p className="text-sm text-ink-soft">None.</p>
        ) : (
          <Table>
            <TableHead>
              <HeaderCell>From</HeaderCell>
              <HeaderCell>Why</HeaderCell>
              <HeaderCell>Origin or address</HeaderCell>
              <HeaderCell>Last address asked for</HeaderCell>
              <HeaderCell>Refused</HeaderCell>
            </TableHead>
            <tbody>
              {refused.map((r) => (
                <Row key={`${r.window_start.toISOString()}|${r.origin}`} top>
                  <Cell className="tabular-nums">{formatDateTime(r.window_start)}</Cell>
                  <Cell>{r.kind === "unknown-token" ? "unknown cycler token" : "from another site"}</Cell>
                  <Cell className="[overflow-wrap:anywhere]">{r.origin}</Cell>
                  <Cell className="[overflow-wrap:anywhere]">{r.last_path}</Cell>
                  <Cell className="tabular-nums">{r.count} {r.count === 1 ? "time" : "times"}</Cell>
                </Row>
              ))}
            </tbody>
          </Table>
        )}
      </section>
    </>
  );
}
