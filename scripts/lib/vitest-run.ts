import { spawn } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "./profiles";
import { log } from "./util";

export interface VitestJson {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests: number;
  success: boolean;
}

const reportDir = path.join(projectRoot, ".data", "test-reports");

/** Runs vitest as a child without blocking: S3 and SMTP are served from this very process. */
export async function vitest(projects: string[], env: Record<string, string>, extra: string[]): Promise<VitestJson> {
  const name = projects.join("+");
  const out = path.join(reportDir, `${name}.json`);
  fs.mkdirSync(reportDir, { recursive: true });
  log("sortie", `vitest: ${projects.join(", ")}`);
  fs.rmSync(out, { force: true });
  const child = spawn(
    path.join(projectRoot, "node_modules", ".bin", "vitest"),
    ["run", ...projects.flatMap((p) => ["--project", p]), "--reporter=default", "--reporter=json", `--outputFile.json=${out}`, "--passWithNoTests", ...extra],
    { cwd: projectRoot, stdio: "inherit", env: { ...process.env, ...env } },
  );
  const status = await new Promise<number>((resolve) => child.on("exit", (code) => resolve(code ?? 1)));
  if (!fs.existsSync(out)) {
    return { numPassedTests: 0, numFailedTests: 1, numPendingTests: 0, numTodoTests: 0, success: false };
  }
  const report = JSON.parse(fs.readFileSync(out, "utf8")) as VitestJson;
  if (status !== 0 && report.success) report.success = false;
  return report;
}

const FIGURES = ["load", "crash", "mail-outage"];

export function clearFigures(): void {
  for (const name of FIGURES) fs.rmSync(path.join(reportDir, `${name}.json`), { force: true });
}

/** The load and fault tests' figures (tests/faults/harness.ts report()), one line each. */
export function printFigures(): void {
  for (const name of FIGURES) {
    const f = path.join(reportDir, `${name}.json`);
    if (fs.existsSync(f)) log("figures", `${name}: ${fs.readFileSync(f, "utf8").replace(/\s+/g, " ")}`);
  }
}

