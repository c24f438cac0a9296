import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import type { RunningService } from "./mariadb";
import type { ServiceProfile } from "./profiles";
import { log } from "./util";

/** Browsers PUT logs straight to the bucket, so it must answer CORS for the app's origin. */
export function corsDocument(origins: string[]): string {
  const allowed = origins.map((o) => `    <AllowedOrigin>${o}</AllowedOrigin>`).join("\n");
  return `<CORSConfiguration>
  <CORSRule>
${allowed}
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;
}

function listening(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ host: "127.0.0.1", port }, () => {
      s.destroy();
      resolve(true);
    });
    s.on("error", () => resolve(false));
  });
}

/** Runs s3rver (an S3-compatible fake) in this process with the profile's bucket. */
export async function startObjectStore(p: ServiceProfile): Promise<RunningService> {
  if (await listening(p.s3Port)) {
    log("s3", `something already listens on 127.0.0.1:${p.s3Port}; re-using it as the object store`);
    return { name: "s3", owned: false, stop: async () => {} };
  }
  const directory = path.join(p.dataDir, "s3");
  fs.mkdirSync(directory, { recursive: true });
  // s3rver ships no types; its constructor options are documented in its README.
  const { default: S3rver } = (await import("s3rver")) as unknown as { default: new (o: object) => S3rverLike };
  const origins = [`http://localhost:${p.appPort}`, `http://127.0.0.1:${p.appPort}`];
  const server = new S3rver({
    port: p.s3Port,
    address: "127.0.0.1",
    directory,
    silent: true,
    configureBuckets: [{ name: p.bucket, configs: [corsDocument(origins)] }],
  });
  await server.run();
  log("s3", `s3rver on http://127.0.0.1:${p.s3Port}, bucket "${p.bucket}" (files under ${directory})`);
  return {
    name: "s3",
    owned: true,
    async stop() {
      // Keep-alive sockets from the SDK would hold close() open for minutes.
      server.httpServer?.closeAllConnections?.();
      await server.close().catch(() => {});
    },
  };
}

interface S3rverLike {
  run(): Promise<unknown>;
  close(): Promise<void>;
  httpServer?: { closeAllConnections?: () => void };
}
