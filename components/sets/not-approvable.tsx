/** Why Approve is not offered on a revision a lead may otherwise review: it is marked not deployable. */
export function NotApprovable({ reason }: { reason: string | null }) {
  return (
    <p className="w-full text-sm text-fault" data-testid="not-approvable">
      Approve is not offered: this revision is marked not deployable{reason ? ` (${reason})` : ""}. Reject it with a reason, or save a new revision that can be deployed.
    </p>
  );
}
