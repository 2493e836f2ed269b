import Link from "next/link";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listReviewQueue } from "@/db/reviews";
import { requirePagePermission } from "@/lib/auth/guards";
import { can, ROLE_LABELS } from "@/lib/auth/permissions";
import { ReviewQueue } from "./review-queue";
import { ROLE_OVERVIEW } from "./role-overview";

export default async function HomePage() {
  const user = await requirePagePermission("workbench.enter");
  const overview = ROLE_OVERVIEW[user.role];
  const queue = can(user.role, "run.review") ? await listReviewQueue(getDb(), user.id) : null;
  return (
    <>
      <PageHeader title={`Good to see you, ${user.displayName.split(" ")[0]}`} lead={`Signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`} />
      {queue && <ReviewQueue entries={queue} />}
      <div className="grid gap-6 md:grid-cols-2">
        <section aria-labelledby="job" className="rounded border border-rule bg-white p-5">
          <h2 id="job" className="mb-2 text-lg font-bold">
            Your part in the lab
          </h2>
          <p>{overview.job}</p>
          {overview.now.length > 0 && (
            <>
              <h3 className="mb-1 mt-4 font-bold">Open now</h3>
              <ul className="list-inside list-disc">
                {overview.now.map((n) => (
                  <li key={n.href}>
                    <Link href={n.href} className="text-copper-deep underline">
                      {n.label}
                    </Link>
                  </li>
                ))}
              </ul>
            </>
          )}
        </section>
        {overview.later.length > 0 && (
          <section aria-labelledby="later" className="rounded border border-dashed border-rule p-5">
            <h2 id="later" className="mb-2 text-lg font-bold">
              Not built yet
            </h2>
            <p className="mb-2 text-sm text-ink-soft">
              This workbench is being built in stages. These parts of your work are planned and are not in this
              version; keep using your current records for them.
            </p>
            <ul className="list-inside list-disc text-sm">
              {overview.later.map((l) => (
                <li key={l}>{l}</li>
              ))}
            </ul>
          </section>
        )}
      </div>
    </>
  );
}
