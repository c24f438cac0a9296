import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { debriefPdf } from "@/lib/reports/pdf-debrief";
import { idSchema } from "@/lib/validations/crew";

// pdfkit reads fonts from disk and works on Node buffers.
export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** The run's debrief as a PDF, shown in the browser (observer or above in the run's crew). */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const pdf = await debriefPdf(actor, id);
  return new Response(new Uint8Array(pdf.body), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `inline; filename="${pdf.fileName}"`,
      // Crew data: never kept by shared caches.
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
