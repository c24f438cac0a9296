import type { z } from "zod";
import { requireActor, type Actor } from "@/lib/auth/actor";
import { HttpError, UnauthenticatedError } from "@/lib/errors";
import { isDatabaseDown } from "@/lib/api/database-down";
import type { FormState } from "./form-state";

const SECRET_FIELDS = /password|confirm|token/i;

function echo(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === "string" && !SECRET_FIELDS.test(k) && !k.startsWith("$")) out[k] = v;
  return out;
}

function failure<T>(e: unknown, values: Record<string, string>): FormState<T> {
  if (e instanceof HttpError) {
    const fields = (e.details as { fields?: Record<string, string[]> } | undefined)?.fields;
    return { status: "error", message: e.message, errors: fields, values };
  }
  if (isDatabaseDown(e)) return { status: "error", message: "The database is not answering; try again in a moment", values };
  // Next's redirect() and notFound() signal by throwing; they must pass through.
  throw e;
}

/** Parses the form with `schema`, then runs `body`; maps every failure to a FormState with all field errors. */
export async function runPublicAction<S extends z.ZodType, T = undefined>(
  form: FormData,
  schema: S,
  body: (data: z.infer<S>) => Promise<FormState<T> | void>,
): Promise<FormState<T>> {
  const values = echo(form);
  const parsed = schema.safeParse(Object.fromEntries(form.entries()));
  if (!parsed.success) {
    const errors: Record<string, string[]> = {};
    for (const issue of parsed.error.issues) (errors[issue.path.join(".") || "_"] ??= []).push(issue.message);
    return { status: "error", message: "Some fields need attention", errors, values };
  }
  try {
    return (await body(parsed.data)) ?? { status: "ok" };
  } catch (e) {
    return failure<T>(e, values);
  }
}

/** As runPublicAction, for signed-in users: the actor is resolved from the session first. */
export async function runAction<S extends z.ZodType, T = undefined>(
  form: FormData,
  schema: S,
  body: (actor: Actor, data: z.infer<S>) => Promise<FormState<T> | void>,
): Promise<FormState<T>> {
  let actor: Actor;
  try {
    actor = await requireActor();
    // Forms are for people in a browser: an API token must not mint tokens or change the profile.
    if (actor.via !== "session") throw new UnauthenticatedError("Sign in in the browser to do this");
  } catch (e) {
    return failure<T>(e, echo(form));
  }
  return runPublicAction(form, schema, (data) => body(actor, data));
}
