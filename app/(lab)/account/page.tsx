import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { listMySessions } from "@/lib/auth/account-security";
import { requirePageAccess } from "@/lib/auth/guards";
import { getCurrentSession } from "@/lib/auth/session";
import { formatDateTime } from "@/lib/format-date-time";
import { ChangePasswordForm } from "./change-password-form";
import { SignOutEverywhereForm } from "./sign-out-everywhere-form";

export const metadata: Metadata = { title: "Your account" };

export default async function AccountPage() {
  const me = await requirePageAccess("/account");
  const session = (await getCurrentSession())!;
  const sessions = await listMySessions(session);
  return (
    <>
      <PageHeader title="Your account" lead={`${me.displayName}, ${me.email}. Change your password and see where you are signed in.`} />
      <section aria-labelledby="password" className="mb-8 max-w-xl rounded border border-rule bg-white p-5">
        <h2 id="password" className="mb-1 text-lg font-bold">
          Change your password
        </h2>
        <p className="mb-3 text-sm text-ink-soft">Your current password is asked again. Your other sessions end; this one stays open.</p>
        <ChangePasswordForm />
      </section>
      <section aria-labelledby="sessions" className="max-w-3xl">
        <h2 id="sessions" className="mb-2 text-lg font-bold">
          Where you are signed in
        </h2>
        <table className="mb-3 w-full border-collapse text-sm" data-testid="my-sessions">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Signed in</th>
              <th className="py-2 pr-3">From address</th>
              <th className="py-2 pr-3">Browser</th>
              <th className="py-2">Ends if unused until</th>
            </tr>
          </thead>
          <tbody>
            {sessions.map((s) => (
              <tr key={s.handle} className="border-b border-rule align-top">
                <td className="py-2 pr-3 tabular-nums">
                  {formatDateTime(s.createdAt)}
                  {s.current && <span className="ml-2 rounded bg-paper-deep px-1 text-xs">this browser</span>}
                </td>
                <td className="py-2 pr-3">{s.address ?? "not recorded"}</td>
                <td className="py-2 pr-3 [overflow-wrap:anywhere]">{s.client ?? "not recorded"}</td>
                <td className="py-2 tabular-nums">{formatDateTime(s.expiresAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <SignOutEverywhereForm count={sessions.length} />
      </section>
    </>
  );
}
