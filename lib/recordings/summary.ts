/** A recording without its samples, as lists and pages show it. */
export interface RecordingSummary {
  id: number;
  channelPath: string;
  channelName: string;
  unit: string;
  name: string;
  notes: string;
  sampleRateHz: number;
  sampleCount: number;
  missingCount: number;
  startedAt: Date | null;
  source: "upload";
  createdBy: number;
  authorName: string;
  createdAt: Date;
}
