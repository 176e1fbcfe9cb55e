/** A channel path from catch-all route segments, or null when a segment is not valid percent-encoding. */
export function channelPathOf(segments: string[]): string | null {
  try {
    return segments.map(decodeURIComponent).join("/");
  } catch {
    return null;
  }
}
