const pad = (n: number) => String(n).padStart(2, "0");

/** Longest title part of a file name, in characters. */
const TITLE_LENGTH = 60;

/**
 * A download name from a chart's title: lowercase letters, digits and hyphens (accents dropped), cut at a
 * word near 60 characters, then the UTC time as yyyymmdd-hhmmss and the extension; "chart" when nothing is left.
 */
export function chartFileName(title: string, extension: string, at: Date): string {
  let slug = title
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "");
  if (slug.length > TITLE_LENGTH) {
    const cut = slug.slice(0, TITLE_LENGTH + 1);
    slug = cut.includes("-") ? cut.slice(0, cut.lastIndexOf("-")) : cut.slice(0, TITLE_LENGTH);
  }
  const stamp = `${at.getUTCFullYear()}${pad(at.getUTCMonth() + 1)}${pad(at.getUTCDate())}-${pad(at.getUTCHours())}${pad(at.getUTCMinutes())}${pad(at.getUTCSeconds())}`;
  return `${slug || "chart"}-${stamp}.${extension}`;
}
