import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
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
          <table className="w-full border-collapse text-sm" data-testid="sign-in-limits">
            <thead>
              <tr className="border-b border-rule text-left">
                <th className="py-2 pr-3">Account</th>
                <th className="py-2 pr-3">Address</th>
                <th className="py-2 pr-3">Failures</th>
                <th className="py-2 pr-3">Last</th>
                <th className="py-2 pr-3">Effect</th>
                <th className="py-2">Clear</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={`${r.email}|${r.address}`} className="border-b border-rule align-top">
                  <td className="py-2 pr-3">{r.email ?? "any"}</td>
                  <td className="py-2 pr-3">{r.address ?? "any"}</td>
                  <td className="py-2 pr-3 tabular-nums">{r.failures}</td>
                  <td className="py-2 pr-3 tabular-nums">{formatDateTime(r.lastAt)}</td>
                  <td className="py-2 pr-3">{r.what}</td>
                  <td className="py-2">
                    <ClearLimitButton email={r.email} address={r.address} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <section aria-labelledby="refused">
        <h2 id="refused" className="mb-2 text-lg font-bold">
          Requests from other sites refused (last 24 hours)
        </h2>
        <p className="mb-2 text-sm text-ink-soft">Counted per 10 minutes and origin; the first of each is in the audit trail. The origin is as the caller sent it, cut to 200 characters.</p>
        {refused.length === 0 ? (
          <p className="text-sm text-ink-soft">None.</p>
        ) : (
          <table className="w-full border-collapse text-sm">
            <thead>
              <tr className="border-b border-rule text-left">
                <th className="py-2 pr-3">From</th>
                <th className="py-2 pr-3">Origin sent</th>
                <th className="py-2 pr-3">Last address asked for</th>
                <th className="py-2">Refused</th>
              </tr>
            </thead>
            <tbody>
              {refused.map((r) => (
                <tr key={`${r.window_start.toISOString()}|${r.origin}`} className="border-b border-rule align-top">
                  <td className="py-2 pr-3 tabular-nums">{formatDateTime(r.window_start)}</td>
                  <td className="py-2 pr-3 [overflow-wrap:anywhere]">{r.origin}</td>
                  <td className="py-2 pr-3 [overflow-wrap:anywhere]">{r.last_path}</td>
                  <td className="py-2 tabular-nums">{r.count} {r.count === 1 ? "time" : "times"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
