"use client";

import { createContext, useContext, type ReactNode } from "react";
import type { ChartMark } from "@/components/charts/uplot-chart";

const MarksContext = createContext<ChartMark[]>([]);

/** Marks (annotations, alarms) for the trace charts inside, in the charts' own x units. */
export function TraceMarks({ marks, children }: { marks: ChartMark[]; children: ReactNode }) {
  return <MarksContext.Provider value={marks}>{children}</MarksContext.Provider>;
}

/** The marks a trace chart should draw; none outside a <TraceMarks>. */
export function useTraceMarks(): ChartMark[] {
  return useContext(MarksContext);
}
