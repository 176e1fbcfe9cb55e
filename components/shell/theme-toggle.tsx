"use client";

/** Switches between the light and dark themes and remembers the choice. */
export function ThemeToggle() {
  function toggle() {
    const dark = document.documentElement.classList.toggle("dark");
    localStorage.setItem("tapwright-theme", dark ? "dark" : "light");
  }
  return (
    <button type="button" onClick={toggle} className="btn-quiet px-2" aria-label="Switch light or dark theme" title="Light / dark">
      <svg viewBox="0 0 20 20" className="h-4 w-4" aria-hidden="true">
        <path d="M10 2a8 8 0 1 0 0 16V2Z" fill="currentColor" />
        <circle cx="10" cy="10" r="7.25" fill="none" stroke="currentColor" strokeWidth="1.5" />
      </svg>
    </button>
  );
}
