import type { Metadata } from "next";
import Link from "next/link";
import { requirePageUser } from "@/app/_lib/auth";
import { ActionForm } from "@/components/sets/action-form";
import { RevisionStages } from "@/components/sets/revision-stages";
import { NotApprovable } from "@/components/sets/not-approvable";
import { RevisionCharts } from "@/components/sets/revision-charts";
import { RevisionCoefficients } from "@/components/sets/revision-coefficients";
import { RevisionSummary } from "@/components/sets/revision-summary";
import { db } from "@/db";
import { listAwaitingReview } from "@/db/queries/revisions";
import { decide } from "@/lib/workflow";
import { transitionAction } from "../sets/[id]/actions";
import { formatDateTime } from "@/lib/format/date-time";

export const metadata: Metadata = { title: "Reviews" };

export default async function ReviewsPage() {
  const me = await requirePageUser("lead");
  const waiting = await listAwaitingReview(db());
  return (
    <section className="space-y-3">
      <header>
        <h1 className="text-lg font-semibold">Waiting for review</h1>
        <p className="text-sm text-slate-500">Revisions submitted by engineers, oldest first. Nobody reviews their own.</p>
      </header>
      {waiting.length === 0 && <p className="card p-4 text-sm text-slate-500">Nothing waits for a review right now.</p>}
      {waiting.map((rev) => {
        const subject = { role: me.role, actorId: me.id, authorId: rev.authorId, state: rev.state, deployable: rev.analysis.deployable.ok };
        const mayReview = decide("reject", subject).ok;
        return (
          <article key={rev.id} className="card grid gap-4 p-4 lg:grid-cols-[1fr_22rem]" data-testid={`review-${rev.id}`}>
            <div className="space-y-2">
              <h2 className="font-semibold">
                <Link href={`/sets/${rev.setId}`} className="text-brand-700 hover:underline dark:text-brand-300">{rev.setName}</Link>{" "}
                <span className="num">r{rev.revision}</span>
              </h2>
              <p className="text-xs text-slate-500"><span className="num">{rev.channel}</span> · by {rev.author} · submitted <span className="num">{formatDateTime(rev.stateChangedAt)}</span></p>
              {rev.notes && <p className="whitespace-pre-wrap text-sm">{rev.notes}</p>}
              <RevisionStages spec={rev.spec} />
              <RevisionSummary rev={rev} />
              <RevisionCharts name={`${rev.setName} r${rev.revision}`} spec={rev.spec} design={rev.design} open />
              <RevisionCoefficients quantized={rev.quantized} />
            </div>
            {mayReview ? (
              <div className="flex flex-wrap content-start gap-2">
                {decide("approve", subject).ok ? (
                  <ActionForm action={transitionAction} fields={{ revisionId: rev.id, action: "approve", expectedVersion: rev.stateVersion }} label="Approve" tone="primary">
                    <textarea name="comment" rows={2} className="field" placeholder="Comment (optional)" aria-label="Approval comment" />
                  </ActionForm>
                ) : (
                  <NotApprovable reason={rev.analysis.deployable.ok ? null : rev.analysis.deployable.reason} />
                )}
                <ActionForm action={transitionAction} fields={{ revisionId: rev.id, action: "reject", expectedVersion: rev.stateVersion }} label="Reject">
                  <textarea name="comment" rows={2} className="field" placeholder="Why (required)" aria-label="Rejection comment" />
                </ActionForm>
              </div>
            ) : (
              <p className="text-sm text-slate-500">You wrote this revision; another lead must review it.</p>
            )}
          </article>
        );
      })}
    </section>
  );
}
