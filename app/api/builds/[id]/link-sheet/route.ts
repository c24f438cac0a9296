import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { getSheetCheck } from "@/lib/builds/build-check";
import { saveLinkSheet } from "@/lib/builds/update-build";
import { linkSheetSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/**
 * Replaces all 18 channels (and the failsafe plan when sent); answers with the new sheet check and
 * how many of the build's runs are being analysed again with the new sheet.
 */
export const PUT = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const { changed, reanalysing } = await saveLinkSheet(actor, id, await readJson(req, linkSheetSchema));
  return { changed, reanalysing, check: await getSheetCheck(actor, id) };
});
