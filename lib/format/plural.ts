/**
 * A count with its noun in English: "1 section", "2 sections", "0 sections" (the plural is the
 * singular plus "s" unless given, e.g. countOf(3, "batch", "batches")).
 */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${n} ${n === 1 ? singular : plural}`;
}
