"use client";

import { useEffect, useState } from "react";
import { DATABASE_DOWN } from "@/components/shell/database-down";

/**
 * A page failed after the layout drew (the details stay in the server's log). When /api/health says
 * the database is down, that is what the page says; otherwise it offers to try again.
 */
export default function LabError({ reset }: { error: Error; reset: () => void }) {
  const [databaseDown, setDatabaseDown] = useState(false);
  useEffect(() => {
    fetch("/api/health", { cache: "no-store" })
      .then((res) => setDatabaseDown(res.status === 503))
      .catch(() => setDatabaseDown(false));
  }, []);
  return (
    <div role="alert" className="card mx-auto mt-10 max-w-xl p-6">
      <h1 className="text-lg font-semibold">{databaseDown ? DATABASE_DOWN : "This page could not be shown"}</h1>
      <p className="mt-1 text-sm text-slate-600 dark:text-slate-300">
        {databaseDown
          ? "Pages wait until PostgreSQL answers again; the sidecar keeps running the production filters meanwhile."
          : "Something went wrong on the server while drawing it. Try again; if it keeps failing, tell whoever runs Tapwright."}
      </p>
      <button type="button" className="btn-primary mt-4" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
