// Shared by server actions and the client forms that show their results.
export type ActionState = {
  ok: boolean;
  message?: string;
  fieldErrors?: Record<string, string[]>;
  /** Echo of what was submitted, so a refused form keeps its values. */
  values?: Record<string, string>;
  /** Ids of the rows the action wrote, for a follow-up such as an undo. */
  written?: string[];
};

export const initialActionState: ActionState = { ok: false };
