import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { SyntheticBench } from "@/components/bench/synthetic-bench";

export const metadata: Metadata = { title: "Chart speed check" };

/**
 * The live chart fed with generated data at 2 kHz (raw, production, four candidates), for `npm run bench`.
 * A tool for whoever runs the product, not a page for users: production builds show it to admins only.
 */
export default async function ChartBenchPage() {
  await requirePageUser(process.env.NODE_ENV === "production" ? "admin" : "operator");
  return (
    <div className="space-y-3">
      <h1 className="text-xl font-semibold">Chart speed check</h1>
      <p className="text-sm text-slate-500">Generated data at 2 kHz, fed at the live rate; no sidecar involved.</p>
      <SyntheticBench sampleRateHz={2000} />
    </div>
  );
}
