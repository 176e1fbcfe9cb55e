/** The caution shown wherever a lead sends coefficients to a device (product notes, "Safety wording"). */
export function SafetyCaution() {
  return (
    <div role="note" className="rounded-md border border-production/60 bg-production/10 p-3 text-sm text-slate-800 dark:text-slate-100">
      <p className="font-medium">Before you promote</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        <li>If this channel feeds a control loop, the filter adds lag (see the group delay): less phase margin, more overshoot, possibly oscillation.</li>
        <li>A notch or low-pass can hide fault frequencies that condition monitoring or a protective function rely on; keep protection on raw or separately specified signals.</li>
        <li>The device runs quantized coefficients; check the quantized response and stability for its format, not only the ideal design.</li>
        <li>Coefficients only mean what they were designed for at one sample rate; Tapwright refuses other rates, but check the device really samples at that rate.</li>
        <li>Switching filters on a running machine can cause a transient; choose a safe moment.</li>
      </ul>
      <p className="mt-2">
        Tapwright is an engineering aid and makes no safety claim. Confirm with your team&apos;s review and the machine&apos;s safety
        documentation; local codes and licensed engineers decide.
      </p>
    </div>
  );
}
