import { NotFoundCard } from "@/components/shell/not-found-card";

export default function LoopChannelNotFound() {
  return (
    <NotFoundCard title="No such channel">
      The address does not name a channel of this lab (it should read /loop/&lt;rig&gt;/&lt;device&gt;/&lt;channel&gt;). Pick one from the overview.
    </NotFoundCard>
  );
}
