import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { dbId } from "@/lib/http/fields";
import { requirePageUser } from "@/app/_lib/auth";
import { ExportControl } from "@/components/export/export-control";
import { ActionForm } from "@/components/sets/action-form";
import { PendingRefresher } from "@/components/sets/pending-refresher";
import { PromoteForm } from "@/components/sets/promote-form";
import { ReviseForm } from "@/components/sets/revise-form";
import { RevisionStages } from "@/components/sets/revision-stages";
import { NotApprovable } from "@/components/sets/not-approvable";
import { RevisionCharts } from "@/components/sets/revision-charts";
import { RevisionCoefficients } from "@/components/sets/revision-coefficients";
import { RevisionSummary } from "@/components/sets/revision-summary";
import { StateBadge } from "@/components/sets/state-badge";
import { db } from "@/db";
import { listChannels } from "@/db/queries/channels";
import { channelDeploymentStates, listSetDeployments } from "@/db/queries/deployments";
import { listReviews, listRevisions } from "@/db/queries/revisions";
import { findSet } from "@/db/queries/sets";
import { roleAtLeast } from "@/lib/auth/roles";
import { decide } from "@/lib/workflow";
import { promoteAction, retireAction, reviseAction, rollbackAction, transitionAction } from "./actions";
import { HiddenExcursions } from "./hidden-excursions";
import { RevisionDiff } from "./revision-diff";
import { formatDateTime } from "@/lib/format/date-time";

export const metadata: Metadata = { title: "Coefficient set" };


export default async function SetPage(props: { params: Promise<{ id: string }>; searchParams: Promise<{ a?: string; b?: string }> }) {
  const me = await requirePageUser();
  const parsedId = dbId.safeParse((await props.params).id);
  const set = parsedId.success ? await findSet(db(), parsedId.data) : undefined;
  if (!set) notFound();
  const id = set.id;
  const [revisions, reviews, deployments, channels] = await Promise.all([
    listRevisions(db(), id),
    listReviews(db(), id),
    listSetDeployments(db(), id),
    listChannels(db()),
  ]);
  const sameRate = channels.filter((c) => c.sampleRateHz === set.sampleRateHz);
  const states = await channelDeploymentStates(db(), sameRate.map((c) => c.id));
  const retired = set.retiredAt !== null;
  const can = (action: Parameters<typeof decide>[0], rev?: (typeof revisions)[number]) =>
    decide(action, { role: me.role, actorId: me.id, authorId: rev?.authorId, state: rev?.state, retired, deployable: rev?.analysis.deployable.ok }).ok;
  const activeHere = deployments.filter((d) => d.state === "active");
  /** The first revision offered for promotion carries the cautions; the others point to them. */
  const firstPromotable = revisions.find((r) => can("promote", r) && r.analysis.deployable.ok)?.id;
  const search = await props.searchParams;

  return (
    <div className="space-y-6">
      <section className="card p-4">
        <div className="flex flex-wrap items-start gap-4">
          <div className="min-w-0 flex-1">
            <p className="text-xs text-slate-500"><Link href="/sets" className="hover:underline">Coefficient sets</Link> /</p>
            <h1 className="text-xl font-semibold" data-testid="set-name">{set.name}</h1>
            <p className="mt-1 text-sm text-slate-600 dark:text-slate-300">
              <span className="num text-xs">{set.channel}</span> · {set.sampleRateHz} Hz · device format {set.format} · started by {set.author}
            </p>
          </div>
          <StateBadge state={set.status} />
          {can("retire") && (
            <ActionForm action={retireAction} fields={{ setId: set.id, expectedVersion: set.version }} label="Retire set" testId="retire-form" />
          )}
        </div>
      </section>

      <section className="card p-4" aria-labelledby="deployments-h">
        <h2 id="deployments-h" className="mb-2 font-semibold">Deployments</h2>
        {deployments.some((d) => d.state === "pending") && <PendingRefresher />}
        {deployments.length === 0 ? (
          <p className="text-sm text-slate-500">No revision of this set has been promoted yet. A lead can promote an approved revision below.</p>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
              <tr><th className="py-1 pr-3">Channel</th><th className="pr-3">Revision</th><th className="pr-3">State</th><th className="pr-3">Requested</th><th className="pr-3">Active since</th><th>Detail</th></tr>
            </thead>
            <tbody>
              {deployments.map((d) => (
                <tr key={d.id} className="border-t border-slate-100 align-top dark:border-slate-800" data-testid={`deployment-${d.id}`} data-channel={d.channel} data-state={d.state}>
                  <td className="num py-1 pr-3 text-xs">{d.channel}</td>
                  <td className="num pr-3">
                    {d.passThrough ? <span className="font-sans">no filter</span> : `r${d.revision}`}
                    {d.kind === "rollback" && <span className="ml-1 text-xs text-slate-500">(rollback)</span>}
                  </td>
                  <td className="pr-3"><StateBadge state={d.state} /></td>
                  <td className="pr-3 text-xs">{d.requestedBy}, <span className="num">{formatDateTime(d.requestedAt)}</span></td>
                  <td className="num pr-3 text-xs">{formatDateTime(d.activatedAt)}</td>
                  <td className="text-xs">
                    {d.reason && <span className="text-fault">{d.reason}</span>}
                    {!d.reason && <span className="num text-slate-500" title={d.checksum}>sha-256 {d.checksum.slice(0, 12)}…</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {roleAtLeast(me.role, "lead") && activeHere.some((d) => !d.passThrough) && (
          <div className="mt-3 flex flex-wrap gap-3">
            {activeHere.filter((d) => !d.passThrough).map((d) => (
              <ActionForm key={d.id} action={rollbackAction} fields={{ channel: d.channel, expectedActiveId: d.id }} testId={`rollback-${d.channel}`}
                {...(d.previousId === null
                  ? { label: `Return ${d.channel} to no filter`, confirm: `Return ${d.channel} to no filter? Its device passes the raw signal through unfiltered once it acknowledges; anything downstream then sees the noise this filter removed. Check with your team's review and the machine's safety documentation first; local codes and licensed engineers decide.` }
                  : { label: `Roll back ${d.channel}`, confirm: `Roll back ${d.channel}? Its device goes back to the filter that was active before this one, once it acknowledges. Check with your team's review and the machine's safety documentation first.` })} />
            ))}
          </div>
        )}
      </section>

      <section className="space-y-3" aria-labelledby="revisions-h">
        <h2 id="revisions-h" className="font-semibold">Revisions</h2>
        {revisions.map((rev, i) => {
          const revReviews = reviews.filter((r) => r.revisionId === rev.id);
          return (
            <article key={rev.id} className="card grid gap-4 p-4 lg:grid-cols-[1fr_24rem]" data-testid={`revision-${rev.revision}`} data-state={rev.state}>
              <div className="space-y-2">
                <div className="flex items-center gap-3">
                  <h3 className="num text-lg font-semibold">r{rev.revision}</h3>
                  <StateBadge state={rev.state} />
                  <span className="text-xs text-slate-500">{rev.author} · <span className="num">{formatDateTime(rev.createdAt)}</span></span>
                </div>
                {rev.notes && <p className="whitespace-pre-wrap text-sm">{rev.notes}</p>}
                <RevisionStages spec={rev.spec} />
                <RevisionSummary rev={rev} />
                <RevisionCharts name={`r${rev.revision}`} spec={rev.spec} design={rev.design} open={i === 0 || rev.state === "in_review"} />
                <RevisionCoefficients quantized={rev.quantized} />
                {revReviews.map((r) => (
                  <p key={r.id} className="text-sm">
                    <StateBadge state={r.decision} /> by {r.reviewer} <span className="num text-xs text-slate-500">{formatDateTime(r.at)}</span>: {r.comment}
                  </p>
                ))}
              </div>
              <div className="space-y-3">
                <ExportControl revisionId={rev.id} defaultTarget={rev.format} refusal={rev.analysis.deployable.ok ? undefined : rev.analysis.deployable.reason} designStable={rev.analysis.stable} />
                {can("submit", rev) && (
                  <ActionForm action={transitionAction} fields={{ revisionId: rev.id, action: "submit", expectedVersion: rev.stateVersion }} label="Submit for review" tone="primary" testId="submit-form" />
                )}
                {rev.state === "in_review" && roleAtLeast(me.role, "lead") && !can("reject", rev) && (
                  <p className="text-sm text-slate-500">You wrote this revision; another lead must review it.</p>
                )}
                {can("reject", rev) && (
                  <div className="flex flex-wrap gap-2">
                    {can("approve", rev) ? (
                      <ActionForm action={transitionAction} fields={{ revisionId: rev.id, action: "approve", expectedVersion: rev.stateVersion }} label="Approve" tone="primary" testId="approve-form">
                        <textarea name="comment" rows={2} className="field" placeholder="Comment (optional)" aria-label="Approval comment" />
                      </ActionForm>
                    ) : (
                      <NotApprovable reason={rev.analysis.deployable.ok ? null : rev.analysis.deployable.reason} />
                    )}
                    <ActionForm action={transitionAction} fields={{ revisionId: rev.id, action: "reject", expectedVersion: rev.stateVersion }} label="Reject" testId="reject-form">
                      <textarea name="comment" rows={2} className="field" placeholder="Why (required)" aria-label="Rejection comment" />
                    </ActionForm>
                  </div>
                )}
                {(rev.state === "in_review" || rev.state === "approved") && !retired && <HiddenExcursions channelPath={set.channel} spec={rev.spec} owner={`user:${me.id}`} />}
                {can("promote", rev) && rev.analysis.deployable.ok && (
                  <PromoteForm
                    action={promoteAction}
                    revisionId={rev.id}
                    revision={rev.revision}
                    defaultChannel={set.channel}
                    showCaution={rev.id === firstPromotable}
                    channels={sameRate.map((c) => ({ path: c.path, format: c.coefficientFormat, ...(states.get(c.id) ?? { active: null, pending: false }) }))}
                  />
                )}
              </div>
            </article>
          );
        })}
      </section>

      {revisions.length > 1 && <RevisionDiff revisions={revisions} a={search.a} b={search.b} />}

      {can("save_revision") && (
        <section className="card p-4">
          <h2 className="mb-2 font-semibold">New revision</h2>
          <ReviseForm action={reviseAction} setId={set.id} latestRevision={set.latestRevision} spec={JSON.stringify(revisions[0]?.spec, null, 2)} />
        </section>
      )}
    </div>
  );
}
