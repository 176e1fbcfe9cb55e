import { NotFoundCard } from "@/components/shell/not-found-card";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-screen-2xl px-4 py-6">
      <NotFoundCard title="Page not found">Tapwright has no page at this address.</NotFoundCard>
    </main>
  );
}
