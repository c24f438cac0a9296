import { getBuild, listBuildChanges, listBuildRuns } from "@/db/queries/builds";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/roles";
import { latestBenchTest } from "./bench-tests";
import { sheetCheckOf } from "./build-check";
import type { Changes } from "./history";
import { photoViews } from "./photos";
import { buildTrends } from "./trends";

/** Everything the build page shows, for anyone who may read the build's crew. */
export async function loadBuildView(actor: Actor, buildId: number) {
  const { record, access } = await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  const [changes, runs, photos, check, benchTests] = await Promise.all([
    listBuildChanges(buildId),
    listBuildRuns(record.crewId, buildId),
    photoViews(buildId),
    sheetCheckOf(record),
    latestBenchTest(record),
  ]);
  const history = changes.map((c) => ({ ...c, changes: c.changes as Changes }));
  return {
    build: record,
    role: access.role,
    mayEdit: can(access.role, "manageBuilds"),
    history,
    runs,
    photos,
    check,
    benchTests,
    trends: buildTrends(runs, history, actor.user.units),
  };
}

export type BuildView = Awaited<ReturnType<typeof loadBuildView>>;

/** The history alone (observers too). */
export async function getBuildHistory(actor: Actor, buildId: number) {
  await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  return listBuildChanges(buildId);
}
