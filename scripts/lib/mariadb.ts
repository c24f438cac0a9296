import { execFileSync, spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import type { ServiceProfile } from "./profiles";
import { log, waitFor } from "./util";

export interface RunningService {
  name: string;
  /** True when this process started it (and so must stop it). */
  owned: boolean;
  stop(): Promise<void>;
}

// Debian puts mariadbd in /usr/sbin, which is not on every user's PATH.
const extraPath = ["/usr/sbin", "/usr/bin", "/sbin"];
process.env.PATH = [...new Set([...(process.env.PATH ?? "").split(":").filter(Boolean), ...extraPath])].join(":");

function which(cmd: string): string | null {
  const r = spawnSync("sh", ["-c", `command -v ${cmd}`], { encoding: "utf8" });
  return r.status === 0 ? r.stdout.trim() : null;
}

/** Installs Debian's mariadb-server when the daemon is missing; refuses clearly without root. */
export function ensureMariaDbInstalled(): void {
  if (which("mariadbd") && which("mariadb-admin") && which("mariadb-install-db")) return;
  if (process.getuid?.() !== 0) {
    throw new Error(
      "MariaDB is not installed and this user cannot install it.\n" +
        "Run as root once: apt-get update && apt-get install -y mariadb-server mariadb-client",
    );
  }
  log("mariadb", "mariadbd not found; installing mariadb-server from Debian packages (one time)…");
  execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit" });
  execFileSync("apt-get", ["install", "-y", "-qq", "mariadb-server", "mariadb-client"], {
    stdio: "inherit",
    env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
  });
}

function paths(p: ServiceProfile) {
  const dir = path.join(p.dataDir, "mariadb");
  return {
    dir,
    data: path.join(dir, "data"),
    socket: path.join(dir, "mysqld.sock"),
    pid: path.join(dir, "mysqld.pid"),
    errorLog: path.join(dir, "error.log"),
  };
}

function admin(socket: string, args: string[]): { ok: boolean; out: string } {
  const r = spawnSync("mariadb-admin", ["--no-defaults", `--socket=${socket}`, "-uroot", ...args], {
    encoding: "utf8",
  });
  return { ok: r.status === 0, out: (r.stdout ?? "") + (r.stderr ?? "") };
}

function sql(socket: string, statements: string): void {
  execFileSync("mariadb", ["--no-defaults", `--socket=${socket}`, "-uroot"], { input: statements });
}

function portInUse(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ host: "127.0.0.1", port }, () => {
      s.destroy();
      resolve(true);
    });
    s.on("error", () => resolve(false));
  });
}

/**
 * Starts a private MariaDB on 127.0.0.1 with its data under the profile's folder.
 * Re-uses an instance that is already answering on our socket (another `npm start`).
 */
export async function startMariaDb(p: ServiceProfile): Promise<RunningService> {
  ensureMariaDbInstalled();
  const f = paths(p);
  const ping = () => admin(f.socket, ["ping", "--silent"]).ok;

  if (fs.existsSync(f.socket) && ping()) {
    log("mariadb", `already running on port ${p.dbPort} (socket ${f.socket}); re-using it`);
    provision(p, f.socket);
    return { name: "mariadb", owned: false, stop: async () => {} };
  }
  if (await portInUse(p.dbPort)) {
    throw new Error(`Port ${p.dbPort} is taken by another program; set SORTIE_DB_PORT to a free port.`);
  }

  fs.mkdirSync(f.dir, { recursive: true });
  if (!fs.existsSync(path.join(f.data, "mysql"))) {
    log("mariadb", `initialising data folder ${f.data}`);
    fs.rmSync(f.data, { recursive: true, force: true });
    execFileSync("mariadb-install-db", [
      "--no-defaults",
      `--user=${process.getuid?.() === 0 ? "root" : (process.env.USER ?? "root")}`,
      `--datadir=${f.data}`,
      "--auth-root-authentication-method=socket",
      "--skip-test-db",
    ], { stdio: ["ignore", "ignore", "inherit"] });
  }

  const args = [
    "--no-defaults",
    ...(process.getuid?.() === 0 ? ["--user=root"] : []),
    `--datadir=${f.data}`,
    "--bind-address=127.0.0.1",
    `--port=${p.dbPort}`,
    `--socket=${f.socket}`,
    `--pid-file=${f.pid}`,
    `--log-error=${f.errorLog}`,
    "--skip-name-resolve",
    "--local-infile=1",
    "--max-allowed-packet=64M",
    "--innodb-buffer-pool-size=512M",
    "--innodb-log-file-size=256M",
    "--character-set-server=utf8mb4",
    "--collation-server=utf8mb4_unicode_ci",
  ];
  const child: ChildProcess = spawn("mariadbd", args, { stdio: "ignore", detached: false });
  let exited = false;
  child.on("exit", () => (exited = true));

  await waitFor("mariadb", () => {
    if (exited) throw new Error(`mariadbd exited during start; see ${f.errorLog}`);
    return ping();
  }, 60_000);
  log("mariadb", `listening on 127.0.0.1:${p.dbPort}`);
  provision(p, f.socket);

  return {
    name: "mariadb",
    owned: true,
    async stop() {
      if (exited) return;
      admin(f.socket, ["shutdown"]);
      await waitFor("mariadb stop", () => exited, 30_000).catch(() => child.kill("SIGKILL"));
    },
  };
}

/** Creates the database and the app's own user (for TCP from 127.0.0.1 and the socket). */
function provision(p: ServiceProfile, socket: string): void {
  const pw = p.dbPassword.replace(/'/g, "''");
  sql(socket, `
    CREATE DATABASE IF NOT EXISTS \`${p.dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    CREATE USER IF NOT EXISTS '${p.dbUser}'@'127.0.0.1' IDENTIFIED BY '${pw}';
    CREATE USER IF NOT EXISTS '${p.dbUser}'@'localhost' IDENTIFIED BY '${pw}';
    ALTER USER '${p.dbUser}'@'127.0.0.1' IDENTIFIED BY '${pw}';
    ALTER USER '${p.dbUser}'@'localhost' IDENTIFIED BY '${pw}';
    GRANT ALL PRIVILEGES ON \`${p.dbName}\`.* TO '${p.dbUser}'@'127.0.0.1';
    GRANT ALL PRIVILEGES ON \`${p.dbName}\`.* TO '${p.dbUser}'@'localhost';
    FLUSH PRIVILEGES;
  `);
}

/** The shell command a developer can paste to reach this profile's database as root. */
export function mariadbShellCommand(p: ServiceProfile): string {
  return `mariadb --no-defaults --socket=${paths(p).socket} -uroot ${p.dbName}`;
}
