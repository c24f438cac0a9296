"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/lib/actions/form-state";
import { runAction } from "@/lib/actions/run-action";
import { inviteMember, revokeInvitation } from "@/lib/crews/invitations";
import { changeMemberRole, removeMember, renameCrew } from "@/lib/crews/members";
import { changeRoleSchema, idSchema, inviteMemberSchema, removeMemberSchema, renameCrewSchema } from "@/lib/validations/crew";

const withCrew = <T extends z.ZodRawShape>(shape: T) => z.object({ crewId: idSchema, ...shape });

export async function inviteMemberAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, withCrew(inviteMemberSchema.shape), async (actor, { crewId, email, role }) => {
    await inviteMember(actor, crewId, { email, role });
    revalidatePath("/crew");
    return { status: "ok", message: `Invitation sent to ${email}. The link works for seven days.` };
  });
}

export async function changeRoleAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, withCrew(changeRoleSchema.shape), async (actor, { crewId, userId, role }) => {
    await changeMemberRole(actor, crewId, userId, role);
    revalidatePath("/crew");
    return { status: "ok", message: "Role changed." };
  });
}

export async function removeMemberAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, withCrew(removeMemberSchema.shape), async (actor, { crewId, userId }) => {
    await removeMember(actor, crewId, userId);
    revalidatePath("/crew");
    return { status: "ok", message: "Member removed." };
  });
}

export async function revokeInvitationAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, z.object({ invitationId: idSchema }), async (actor, { invitationId }) => {
    await revokeInvitation(actor, invitationId);
    revalidatePath("/crew");
    return { status: "ok", message: "Invitation withdrawn." };
  });
}

export async function renameCrewAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, withCrew(renameCrewSchema.shape), async (actor, { crewId, name }) => {
    await renameCrew(actor, crewId, name);
    revalidatePath("/", "layout");
    return { status: "ok", message: "Crew renamed." };
  });
}
