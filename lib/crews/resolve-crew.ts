import { listCrewsOfUser } from "@/db/queries/crews";
import type { Actor } from "@/lib/auth/actor";
import { ValidationError } from "@/lib/errors";

/**
 * Which crew a new record goes to: the one named in the request (membership is checked by the
 * caller), else the caller's only crew. Someone in several crews must say which.
 */
export async function crewForNewRecord(actor: Actor, requested: number | undefined, fallback?: number | null): Promise<number> {
  if (requested) return requested;
  if (fallback) return fallback;
  const crews = await listCrewsOfUser(actor.user.id);
  if (crews.length === 1) return crews[0].crewId;
  throw new ValidationError("Say which crew this belongs to (crewId); you are a member of several", {
    fields: { crewId: ["Required when you belong to more than one crew"] },
  });
}
