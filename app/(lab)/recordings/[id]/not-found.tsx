import { NotFoundCard } from "@/components/shell/not-found-card";

export default function RecordingNotFound() {
  return (
    <NotFoundCard title="No such recording">
      There is no recording with this number, or it was deleted. The Recordings page lists the ones there are.
    </NotFoundCard>
  );
}
