import { closeDb } from "./client";
import { demoCrew, demoPassword } from "./demo-crew";
import { seedDemo } from "./seed-demo";

seedDemo()
  .then(({ created }) => {
    console.log(`[db] demo crew "${demoCrew.name}" ${created ? "created" : "already present"}`);
    for (const m of demoCrew.members) console.log(`     ${m.role.padEnd(8)} ${m.email} / ${demoPassword}`);
  })
  .catch((e) => {
    console.error(`[db] seeding failed: ${(e as Error).message}`);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
