"use client";

import { useEffect, useState } from "react";

/** The wall clock (epoch ms) for rendering, read when the component mounts and again every `periodMs`. */
export function useClock(periodMs: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), periodMs);
    return () => clearInterval(timer);
  }, [periodMs]);
  return now;
}
