import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProceduresAwaitingRelease, listRunsInStates } from "@/db/queues";
import { listReviewQueue } from "@/db/reviews";
import { requirePageAccess } from "@/lib/auth/guards";
import { can, ROLE_LABELS } from "@/lib/auth/permissions";
import { ReleaseQueue, RunQueue } from "./home-queues";
import { ReviewQueue } from "./review-queue";
import { ROLE_OVERVIEW } from "./role-overview";

/** Home: what waits for you, queue by queue for your role, then your part in the lab. */
export default async function HomePage() {
  const user = await requirePageAccess("/");
  const overview = ROLE_OVERVIEW[user.role];
  const db = getDb();
  const [release, review, toCertify, returned, open] = await Promise.all([
    can(user.role, "procedure.release") ? listProceduresAwaitingRelease(db, user.id) : null,
    can(user.role, "run.review") ? listReviewQueue(db, user.id) : null,
    can(user.role, "certificate.sign") ? listRunsInStates(db, { statuses: ["accepted"], notOperatedBy: user.id }) : null,
    can(user.role, "run.operate") ? listRunsInStates(db, { statuses: ["returned"], operatorId: user.id }) : null,
    can(user.role, "run.operate") ? listRunsInStates(db, { statuses: ["planned", "in_progress"], operatorId: user.id }) : null,
  ]);
  return (
    <>
      <PageHeader title={`Good to see you, ${user.displayName.split(" ")[0]}`} lead={`Signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`} />
      {returned && (
        <RunQueue
          id="returned-queue"
          title="Your runs returned with comments"
          empty="No run of yours has been returned."
          entries={returned}
          since="Returned"
          act={(e) => ({ href: `/runs/${e.runId}`, label: `Read the comments and correct run ${e.runNumber}` })}
        />
      )}
      {open && (
        <RunQueue
          id="open-runs-queue"
          title="Your runs in progress"
          empty="You have no run planned or in progress."
          entries={open}
          since="Last change"
          act={(e) => ({ href: `/runs/${e.runId}`, label: `Continue run ${e.runNumber}` })}
        />
      )}
      {release && <ReleaseQueue entries={release} />}
      {review && <ReviewQueue entries={review} />}
      {toCertify && (
        <RunQueue
          id="certify-queue"
          title="Certificates to issue"
          empty="No accepted run waits for its certificate."
          entries={toCertify}
          since="Accepted"
          showOperator
          act={(e) => ({ href: `/runs/${e.runId}/review`, label: `Issue the certificate of run ${e.runNumber}` })}
        />
      )}
      <section aria-labelledby="job" className="rounded border border-rule bg-white p-5">
        <h2 id="job" className="mb-2 text-lg font-bold">
          Your part in the lab
        </h2>
        <p>{overview.job}</p>
        {overview.now.length > 0 && (
          <>
            <h3 className="mb-1 mt-4 font-bold">Where to find it</h3>
            <ul className="list-inside list-disc">
              {overview.now.map((n) => (
                <li key={n.href}>
                  <TextLink href={n.href}>
                    {n.label}
                  </TextLink>
                </li>
              ))}
            </ul>
          </>
        )}
      </section>
    </>
  );
}
