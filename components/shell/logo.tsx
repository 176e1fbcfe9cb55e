/** The Tapwright mark: a tapped delay line drawn as three taps feeding one line. */
export function Logo() {
  return (
    <span className="flex items-center gap-2 font-semibold tracking-tight">
      <svg viewBox="0 0 24 24" className="h-6 w-6 text-brand-500" aria-hidden="true">
        <path d="M3 17h18" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        <path d="M6 17V9M12 17V5M18 17v-5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        <circle cx="6" cy="8" r="1.6" fill="currentColor" />
        <circle cx="12" cy="4" r="1.6" fill="currentColor" />
        <circle cx="18" cy="11" r="1.6" fill="currentColor" />
      </svg>
      <span>Tapwright</span>
    </span>
  );
}
