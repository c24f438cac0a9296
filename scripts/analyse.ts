/**
 * `npm run analyse -- <log> [--route plan.gpx|plan.json] [--build build.json] [--map column-map.json] [--json]`
 * Parses and analyses one log with the same code as the server, no database needed, and prints
 * one JSON document; a file holding several separate runs (lib/parsers/run-splitter.ts) prints
 * `{"runs": [ … ]}`, one such document per run in file order. Exit 0 on success; exit 2 with a
 * one-line message on stderr for bad input.
 */
import fs from "node:fs";
import path from "node:path";
import type { BuildConfig, RoutePlanInput } from "@/lib/analysis/types";
import { analyseLogFile } from "@/lib/offline/analyse-log-file";
import { columnMapSchema, type ColumnMap } from "@/lib/parsers/column-map";
import { parseGpxRoutePlan } from "@/lib/parsers/gpx-route-plan";
import { ParseError } from "@/lib/parsers/types";
import { buildConfigSchema, routePlanInputSchema } from "@/lib/validations/analysis-input";

class UsageError extends Error {}

function args(argv: string[]) {
  const out: { log?: string; route?: string; build?: string; map?: string } = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--json") continue;
    if (a === "--route" || a === "--build" || a === "--map") {
      const v = argv[++i];
      if (!v) throw new UsageError(`${a} needs a file name`);
      out[a.slice(2) as "route" | "build" | "map"] = v;
    } else if (a.startsWith("--")) throw new UsageError(`unknown option ${a}`);
    else if (!out.log) out.log = a;
    else throw new UsageError(`unexpected argument ${a}`);
  }
  if (!out.log) throw new UsageError("usage: npm run analyse -- <log> [--route plan] [--build build.json] [--map column-map.json] --json");
  return out;
}

function readJson(file: string, what: string): unknown {
  try {
    return JSON.parse(fs.readFileSync(file, "utf8"));
  } catch (e) {
    throw new UsageError(`${what} ${file}: ${(e as Error).message}`);
  }
}

function checked<T>(schema: { safeParse(v: unknown): { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[]; message: string }[] } } }, v: unknown, what: string): T {
  const r = schema.safeParse(v);
  if (r.success) return r.data;
  const i = r.error.issues[0];
  throw new UsageError(`${what}: ${i.path.join(".") || "(root)"}: ${i.message}`);
}

function loadPlan(file: string): RoutePlanInput {
  if (/\.gpx$/i.test(file) || fs.readFileSync(file, "utf8").trimStart().startsWith("<")) {
    const plan = parseGpxRoutePlan(fs.readFileSync(file, "utf8"));
    return { waypoints: plan.waypoints };
  }
  return checked(routePlanInputSchema, readJson(file, "route plan"), `route plan ${path.basename(file)}`);
}

async function main() {
  const a = args(process.argv.slice(2));
  if (!fs.existsSync(a.log!)) throw new UsageError(`no such file: ${a.log}`);
  const build: BuildConfig | undefined = a.build ? checked(buildConfigSchema, readJson(a.build, "build"), `build ${path.basename(a.build)}`) : undefined;
  const plan = a.route ? loadPlan(a.route) : undefined;
  const columnMap: ColumnMap | undefined = a.map ? checked(columnMapSchema, readJson(a.map, "column map"), `column map ${path.basename(a.map)}`) : undefined;

  const docs = await analyseLogFile(a.log!, { build, plan, columnMap });
  const out = docs.length === 1 ? docs[0] : { runs: docs };
  process.stdout.write(JSON.stringify(out, null, 2) + "\n");
}

main().catch((e) => {
  if (e instanceof ParseError) process.stderr.write(`${e.describe()}\n`);
  else if (e instanceof UsageError) process.stderr.write(`${e.message}\n`);
  else {
    process.stderr.write(`analyse failed: ${(e as Error).message}\n`);
    process.exit(1);
  }
  process.exit(2);
});
