/** A duration in s as people read it: "850 ms", "12.5 s", "3 min 20 s", "1 h 5 min". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return "—";
  if (seconds < 1) return `${Number((seconds * 1000).toPrecision(3))} ms`;
  if (seconds < 60) return `${Number(seconds.toPrecision(3))} s`;
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const min = Math.floor((total % 3600) / 60);
  const s = total % 60;
  return h > 0 ? `${h} h ${min} min` : `${min} min ${s} s`;
}
