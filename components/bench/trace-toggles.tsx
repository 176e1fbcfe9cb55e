import { Swatch } from "@/components/ui/swatch";

/** One "Show <trace>" checkbox per trace with its colour; read-only without `onToggle`. */
export function TraceToggles({ traces, onToggle }: { traces: { id: string; label: string; color: string; visible: boolean }[]; onToggle?: (id: string, visible: boolean) => void }) {
  return (
    <div className="flex flex-wrap gap-x-4 gap-y-1 px-4 pt-2 text-sm">
      {traces.map((t) => (
        <label key={t.id} className="flex items-center gap-1.5">
          <input type="checkbox" checked={t.visible} disabled={!onToggle} onChange={(e) => onToggle?.(t.id, e.target.checked)} aria-label={`Show ${t.label}`} />
          <Swatch color={t.color} />
          <span>{t.label}</span>
        </label>
      ))}
    </div>
  );
}
