"use client";

import { useRouter } from "next/navigation";
import { useEffect } from "react";

/** While a deployment waits for its device, re-renders the page every `everyMs` so the outcome appears. */
export function PendingRefresher({ everyMs = 1000 }: { everyMs?: number }) {
  const router = useRouter();
  useEffect(() => {
    const timer = setInterval(() => router.refresh(), everyMs);
    return () => clearInterval(timer);
  }, [router, everyMs]);
  return (
    <p role="status" className="text-sm text-sky-700 dark:text-sky-300">
      Waiting for the device to acknowledge…
    </p>
  );
}
