/**
 * A cell a spreadsheet would run as a formula (it starts with =, +, -, @, a tab or a CR) gets a
 * leading apostrophe, so it is shown as text (OWASP, "CSV Injection").
 */
export function neutralised(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** One CSV field per RFC 4180 §2, neutralised: quoted when it holds a quote, comma, CR or LF; quotes doubled. */
export function csvField(value: string): string {
  const safe = neutralised(value);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}
