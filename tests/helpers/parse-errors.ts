import path from "node:path";
import { expect } from "vitest";
import { ParseError } from "@/lib/parsers/types";

/** Real GPX recordings from open-source GPX libraries' test suites (see SOURCES.md there). */
export const GPX_REFERENCE_DIR = path.resolve(process.cwd(), "../shared/reference/gpx");

/** Runs `fn`, which must throw a ParseError, and returns it (any other error, or none, fails). */
export function parseErrorOf(fn: () => unknown): ParseError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ParseError);
    return e as ParseError;
  }
  return expect.unreachable("expected a ParseError");
}

/** As parseErrorOf, for a promise that must reject with a ParseError. */
export function parseErrorOfAsync(p: Promise<unknown>): Promise<ParseError> {
  return p.then(
    () => expect.unreachable("expected a ParseError"),
    (e) => {
      expect(e).toBeInstanceOf(ParseError);
      return e as ParseError;
    },
  );
}
