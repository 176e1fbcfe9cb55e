import { AppError } from "@/lib/errors";
import type { Decision } from "./permissions";

/** Throws the workflow rule's refusal as an AppError (403 or 409). */
export function enforce(decision: Decision): void {
  if (!decision.ok) throw new AppError(decision.code, decision.reason);
}
