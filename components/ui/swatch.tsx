/** A small colour chip naming a trace's colour on the charts. */
export function Swatch({ color, dashed = false }: { color: string; dashed?: boolean }) {
  return (
    <span
      aria-hidden="true"
      className="inline-block h-2.5 w-5 shrink-0 rounded-sm"
      style={dashed ? { backgroundImage: `repeating-linear-gradient(90deg, ${color} 0 4px, transparent 4px 7px)` } : { backgroundColor: color }}
    />
  );
}
