"use client";

/** A choice of channel by name and path. */
export function ChannelSelect({
  channels,
  value,
  onChange,
  className = "",
}: {
  channels: readonly { path: string; name: string }[];
  value: string;
  onChange: (path: string) => void;
  className?: string;
}) {
  return (
    <label className={`text-sm ${className}`}>
      <span className="label">Channel</span>
      <select className="field py-1" value={value} onChange={(e) => onChange(e.target.value)}>
        {channels.map((c) => (
          <option key={c.path} value={c.path}>
            {c.name} ({c.path})
          </option>
        ))}
      </select>
    </label>
  );
}
