import { NotFoundCard } from "@/components/shell/not-found-card";

export default function SetNotFound() {
  return (
    <NotFoundCard title="No such coefficient set">
      There is no coefficient set with this number. It may never have existed, or the address was mistyped; the Sets page lists them all.
    </NotFoundCard>
  );
}
