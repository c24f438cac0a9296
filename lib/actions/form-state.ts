/** What every form's server action returns; rendered beside the inputs and in a live region. */
export interface FormState<T = undefined> {
  status: "idle" | "ok" | "error";
  message?: string;
  errors?: Record<string, string[]>;
  /** Sent values echoed back so a failed form keeps them (never passwords). */
  values?: Record<string, string>;
  result?: T;
}

export const idle: FormState = { status: "idle" };
