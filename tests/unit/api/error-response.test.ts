import { describe, expect, it } from "vitest";
import { z } from "zod";
import { errorResponse } from "@/lib/api/handler";
import { isDatabaseDown } from "@/lib/api/database-down";
import { ConflictError, ForbiddenError, NotFoundError, RateLimitedError, UnauthenticatedError, ValidationError } from "@/lib/errors";

async function body(r: Response) {
  return (await r.json()) as { error: { code: string; message: string; details?: { fields?: Record<string, string[]> } } };
}

describe("errorResponse", () => {
  it.each([
    [new UnauthenticatedError(), 401, "unauthenticated"],
    [new ForbiddenError(), 403, "forbidden"],
    [new NotFoundError("Build"), 404, "not_found"],
    [new ConflictError("dup"), 409, "conflict"],
    [new ValidationError("bad"), 422, "invalid_input"],
  ])("maps %s to its status", async (err, status, code) => {
    const r = errorResponse(err);
    expect(r.status).toBe(status);
    expect((await body(r)).error.code).toBe(code);
  });

  it("turns a zod error into 422 with every field listed", async () => {
    const schema = z.object({ a: z.string(), b: z.number() });
    const r = errorResponse(schema.safeParse({}).error);
    expect(r.status).toBe(422);
    expect(Object.keys((await body(r)).error.details!.fields!).sort()).toEqual(["a", "b"]);
  });

  it("adds Retry-After to 429", () => {
    const r = errorResponse(new RateLimitedError("slow down", 900));
    expect(r.status).toBe(429);
    expect(r.headers.get("retry-after")).toBe("900");
  });

  it("answers 503 when the database connection is refused, without internals", async () => {
    const e = Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:3307"), { code: "ECONNREFUSED" });
    const r = errorResponse(new Error("Failed query", { cause: e }));
    expect(r.status).toBe(503);
    expect(JSON.stringify(await body(r))).not.toContain("127.0.0.1");
  });

  it("hides unexpected errors behind a generic 500", async () => {
    const r = errorResponse(new Error("secret detail"));
    expect(r.status).toBe(500);
    expect(JSON.stringify(await body(r))).not.toContain("secret detail");
  });
});

describe("isDatabaseDown", () => {
  it("ignores ordinary query errors", () => {
    expect(isDatabaseDown(Object.assign(new Error("dup"), { code: "ER_DUP_ENTRY" }))).toBe(false);
    expect(isDatabaseDown(null)).toBe(false);
  });
});
