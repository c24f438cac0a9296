/** Query strings of the series endpoints (lib/series/query.ts): every problem a 422 that names it. */
import { describe, expect, it } from "vitest";
import type { z } from "zod";
import { ValidationError } from "@/lib/errors";
import { parseQuery, pointsQuerySchema, seriesQuerySchema } from "@/lib/series/query";
import { MAX_POINTS } from "@/lib/series/types";

const url = (q: string) => `http://localhost/api/runs/1/series?${q}`;

function problem(q: string, schema: z.ZodType = seriesQuerySchema): ValidationError {
  try {
    parseQuery(url(q), schema);
  } catch (e) {
    if (e instanceof ValidationError) return e;
    throw e;
  }
  throw new Error(`"${q}" was accepted`);
}

describe("series query", () => {
  it("reads fields, range and points, with defaults", () => {
    expect(parseQuery(url("fields=rssiDbm,lqPct"), seriesQuerySchema)).toEqual({ fields: ["rssiDbm", "lqPct"], points: 2000 });
    expect(parseQuery(url("fields=rssiDbm&from=10&to=20.5&points=500&v=1.2"), seriesQuerySchema)).toEqual({ fields: ["rssiDbm"], from: 10, to: 20.5, points: 500, v: "1.2" });
    // Empty placeholders mean "not given"; repeated fields are read once.
    expect(parseQuery(url("fields=xteM,xteM&from=&to=&points="), seriesQuerySchema)).toEqual({ fields: ["xteM"], points: 2000 });
  });

  it("names an unknown field", () => {
    const e = problem("fields=rssiDbm,warp");
    expect(e.status).toBe(422);
    expect(e.message).toMatch(/Unknown field "warp"/);
    expect(e.message).toMatch(/distanceFromHomeM/);
    // tS is the x axis, not a field.
    expect(problem("fields=tS").message).toMatch(/Unknown field "tS"/);
  });

  it("needs fields", () => {
    expect(problem("points=10").message).toMatch(/fields is required/);
    expect(problem("fields=").message).toMatch(/at least one/);
  });

  it("needs from before to, and finite numbers", () => {
    expect(problem("fields=altM&from=20&to=10").message).toBe("from must be less than to");
    expect(problem("fields=altM&from=5&to=5").message).toBe("from must be less than to");
    expect(problem("fields=altM&from=soon").message).toMatch(/from must be a number/);
    expect(problem("fields=altM&to=Infinity").message).toMatch(/to must be a number/);
  });

  it("keeps points within 2 … MAX_POINTS", () => {
    expect(problem("fields=altM&points=1").message).toBe("points must be at least 2");
    expect(problem(`fields=altM&points=${MAX_POINTS + 1}`).message).toBe(`points must be at most ${MAX_POINTS}`);
    expect(problem("fields=altM&points=2.5").message).toBe("points must be a whole number");
    expect(parseQuery(url(`fields=altM&points=${MAX_POINTS}`), seriesQuerySchema).points).toBe(MAX_POINTS);
  });

  it("points query: fields and points", () => {
    expect(parseQuery(url("fields=rssiDbm,distanceFromHomeM"), pointsQuerySchema)).toEqual({ fields: ["rssiDbm", "distanceFromHomeM"], points: 2000 });
    expect(problem("fields=nope", pointsQuerySchema).status).toBe(422);
  });
});
