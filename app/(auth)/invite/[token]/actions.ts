"use server";

import { redirect } from "next/navigation";
import type { FormState } from "@/lib/actions/form-state";
import { runPublicAction } from "@/lib/actions/run-action";
import { setActiveCrewCookie } from "@/lib/auth/active-crew";
import { getActor } from "@/lib/auth/actor";
import { acceptInvitation } from "@/lib/crews/invitations";
import { ValidationError } from "@/lib/errors";
import { acceptInvitationSchema } from "@/lib/validations/auth";

export async function acceptInvitationAction(
  _prev: FormState<{ email: string }>,
  form: FormData,
): Promise<FormState<{ email: string }>> {
  let joinedCrew: number | null = null;
  const state = await runPublicAction(form, acceptInvitationSchema, async ({ token, name, password }) => {
    const actor = await getActor();
    if (actor) {
      joinedCrew = (await acceptInvitation(token, { userId: actor.user.id })).crewId;
      return;
    }
    if (!name || !password) {
      throw new ValidationError("Enter your name and a password to create the account", {
        fields: { ...(name ? {} : { name: ["Enter your name"] }), ...(password ? {} : { password: ["Choose a password"] }) },
      });
    }
    // A new account has only this crew, so no crew cookie is needed; setting one here would
    // re-render the (now spent) invitation page before the browser signs in.
    const joined = await acceptInvitation(token, { name, password });
    return { status: "ok", message: "Welcome aboard. Signing you in…", result: { email: joined.email } };
  });
  if (joinedCrew) {
    await setActiveCrewCookie(joinedCrew);
    redirect("/dashboard");
  }
  return state;
}
