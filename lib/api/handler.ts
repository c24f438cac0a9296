import { NextResponse } from "next/server";
import { z } from "zod";
import { HttpError, NotFoundError, RateLimitedError, ValidationError } from "@/lib/errors";
import { env } from "@/lib/env";
import { isDatabaseDown } from "./database-down";
import { crossSiteProblem, sameOriginInputFromRequest } from "./same-origin";

type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler: one place maps domain errors to status codes and JSON bodies
 * ({ error: { code, message, details? } }), so handlers stay a few lines of wiring.
 *
 * It also refuses cross-site unsafe requests that ride on the session cookie (ASVS V4.2.2,
 * V13.2.3): see same-origin.ts. Server actions are not routed here; Next itself compares their
 * Origin with the Host (and serverActions.allowedOrigins) before running one.
 */
export function apiRoute<P = Record<string, never>>(
  handler: (req: Request, ctx: { params: P }) => Promise<Response | unknown>,
) {
  return async (req: Request, ctx: RouteContext<P>): Promise<Response> => {
    try {
      const csrf = crossSiteProblem(sameOriginInputFromRequest(req, new URL(env().APP_URL).origin));
      if (csrf) throw new HttpError(403, "csrf", "Refused: this request did not come from Sortie itself", { reason: csrf.slice(0, 200) });
      const params = ctx?.params ? await ctx.params : ({} as P);
      const out = await handler(req, { params });
      return out instanceof Response ? out : NextResponse.json(out);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

export function errorResponse(e: unknown): Response {
  if (e instanceof z.ZodError) e = ValidationError.fromZod(e);
  if (e instanceof HttpError) {
    const headers: Record<string, string> = {};
    if (e instanceof RateLimitedError) headers["retry-after"] = String(e.retryAfterS);
    if (e.status === 503) headers["retry-after"] = "5";
    return NextResponse.json({ error: { code: e.code, message: e.message, details: e.details } }, { status: e.status, headers });
  }
  if (isDatabaseDown(e)) {
    return NextResponse.json(
      { error: { code: "unavailable", message: "The database is not answering; try again shortly" } },
      { status: 503, headers: { "retry-after": "5" } },
    );
  }
  console.error("[api] unhandled error", e);
  return NextResponse.json({ error: { code: "internal", message: "Something went wrong on our side" } }, { status: 500 });
}

/** Validates an already-read body with a schema; every field's problems become one 422. */
export function parseBody<T extends z.ZodType>(body: unknown, schema: T): z.infer<T> {
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw ValidationError.fromZod(parsed.error);
  return parsed.data;
}

async function readBody(req: Request, emptyIsObject: boolean): Promise<unknown> {
  const text = await req.text();
  if (emptyIsObject && !text.trim()) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new ValidationError("The request body must be JSON");
  }
}

/** Parses a JSON body with a schema; a body that is not JSON is a 422 too. */
export async function readJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  return parseBody(await readBody(req, false), schema);
}

/** As readJson, but an empty body counts as `{}`. */
export async function readOptionalJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  return parseBody(await readBody(req, true), schema);
}

/** Route params that cannot name a record (e.g. a non-numeric id) are simply not found. */
export function parseParams<T extends z.ZodType>(params: unknown, schema: T): z.infer<T> {
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw new NotFoundError();
  return parsed.data;
}
