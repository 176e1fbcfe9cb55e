import type { SetStatus } from "./states";

/** One coefficient set as the sets list shows it; `updatedAt` is a Date from the database and an ISO string over JSON. */
export interface SetListItem<When = Date> {
  id: number;
  name: string;
  channel: string;
  status: SetStatus;
  latestRevision: number;
  author: string;
  updatedAt: When;
}
