import type { Transaction } from "kysely";
import { revalidatePath } from "next/cache";
import { db } from "@/db";
import type { Database } from "@/db/types";
import { actionMaker } from "@/lib/http/action";
import { requireActionUser } from "@/app/_lib/auth";

/** Every server action is made here: lib/http/action.ts's flow with the session, the database and Next's cache. */
export const defineAction = actionMaker<Transaction<Database>>({
  requireUser: requireActionUser,
  transaction: (work) => db().transaction().execute(work),
  revalidate: (path, type) => revalidatePath(path, type),
  log: (action, err) => console.error(`[${action}]`, err),
});
