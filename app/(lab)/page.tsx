import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProceduresAwaitingRelease, listRunsInStates } from "@/db/queues";
import { listReviewQueue } from "@/db/reviews";
import { requirePageAccess } from "@/lib/auth/guards";
import { can, ROLE_LABELS } from "@/lib/auth/permissions";
import { keptParams, PAGE_SIZE, parsePageNumber, type RawSearchParams } from "@/lib/lists/list-params";
import { ReleaseQueue, ReviewQueue, RunQueue } from "./home-queues";
import { ROLE_OVERVIEW } from "./role-overview";

/**
 * Home: what waits for you, queue by queue for your role, then your part in the lab. Each queue pages in
 * place by its own parameter (named after its section): a queue is defined by who is asking (not your own
 * runs to certify, not your own versions to release), which no filter of the full lists expresses.
 */
export default async function HomePage({ searchParams }: { searchParams: Promise<RawSearchParams> }) {
  const user = await requirePageAccess("/");
  const overview = ROLE_OVERVIEW[user.role];
  const db = getDb();
  const raw = await searchParams;
  const kept = keptParams(raw);
  const pageOf = (queue: string) => ({ page: parsePageNumber(raw, queue), pageSize: PAGE_SIZE });
  const [release, review, toCertify, returned, open] = await Promise.all([
    can(user.role, "procedure.release") ? listProceduresAwaitingRelease(db, user.id, pageOf("release-queue")) : null,
    can(user.role, "run.review") ? listReviewQueue(db, user.id, pageOf("review-queue")) : null,
    can(user.role, "certificate.sign") ? listRunsInStates(db, { statuses: ["accepted"], notOperatedBy: user.id }, pageOf("certify-queue")) : null,
    can(user.role, "run.operate") ? listRunsInStates(db, { statuses: ["returned"], operatorId: user.id }, pageOf("returned-queue")) : null,
    can(user.role, "run.operate") ? listRunsInStates(db, { statuses: ["planned", "in_progress"], operatorId: user.id }, pageOf("open-runs-queue")) : null,
  ]);
  return (
    <>
      <PageHeader title={`Good to see you, ${user.displayName.split(" ")[0]}`} lead={`Signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`} />
      {returned && (
        <RunQueue
          id="returned-queue"
          title="Your runs returned with comments"
          empty="No run of yours has been returned."
          page={returned}
          kept={kept}
          since="Returned"
          act={(e) => ({ href: `/runs/${e.runId}`, words: "Read the comments and correct run" })}
        />
      )}
      {open && (
        <RunQueue
          id="open-runs-queue"
          title="Your runs in progress"
          empty="You have no run planned or in progress."
          page={open}
          kept={kept}
          since="Last change"
          act={(e) => ({ href: `/runs/${e.runId}`, words: "Continue run" })}
        />
      )}
      {release && <ReleaseQueue page={release} kept={kept} />}
      {review && <ReviewQueue page={review} kept={kept} />}
      {toCertify && (
        <RunQueue
          id="certify-queue"
          title="Certificates to issue"
          empty="No accepted run waits for its certificate."
          page={toCertify}
          kept={kept}
          since="Accepted"
          showOperator
          act={(e) => ({ href: `/runs/${e.runId}/review`, words: "Issue the certificate of run" })}
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
