import { z } from "zod";
import { roles } from "@/db/schema/crews";
import { crewNameSchema, emailSchema } from "./auth";

export const idSchema = z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER);
export const roleSchema = z.enum(roles, { message: "Choose lead, pilot or observer" });

export const inviteMemberSchema = z.object({
  email: emailSchema,
  role: roleSchema,
});

export const changeRoleSchema = z.object({
  userId: idSchema,
  role: roleSchema,
});

export const removeMemberSchema = z.object({ userId: idSchema });
export const renameCrewSchema = z.object({ name: crewNameSchema });
export const createCrewSchema = z.object({ name: crewNameSchema });
export const switchCrewSchema = z.object({ crewId: idSchema });
