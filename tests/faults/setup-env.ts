// Runs before each fault-test file (vitest setupFiles), so modules that read settings at import
// (the inbox helper, the database client) see the faults stack rather than the main test stack.
import { appEnv, profile } from "@/scripts/lib/profiles";

const p = profile("faults");
Object.assign(process.env, appEnv(p), {
  SORTIE_TEST_APP_URL: `http://localhost:${p.appPort}`,
  NEXTAUTH_SECRET: "faults-stack-secret-not-for-production-0123456789",
});
