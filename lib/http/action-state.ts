/** What a server action returns to its form: success or a message, with per-field errors. */
export interface ActionState {
  ok: boolean;
  message?: string;
  fieldErrors?: Record<string, string>;
}

export type FormAction = (prev: ActionState, form: FormData) => Promise<ActionState>;
