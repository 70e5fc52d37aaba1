// Ensures a PostgreSQL cluster from Debian's packages runs on loopback for this checkout.
// PostgreSQL refuses to run as root, so as root every server command runs as the `postgres` user.
import { execFileSync, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, rmSync, chownSync } from "node:fs";
import path from "node:path";

export interface ClusterOptions {
  dataDir: string;
  port: number;
  database: string;
  log?: (line: string) => void;
}

export interface Cluster {
  url: string;
  adminUrl: string;
  dataDir: string;
  stop(): void;
}

const isRoot = process.getuid?.() === 0;

function findBinDir(): string | null {
  const candidates = readdirSafe("/usr/lib/postgresql")
    .sort((a, b) => Number(b) - Number(a))
    .map((v) => `/usr/lib/postgresql/${v}/bin`);
  for (const dir of candidates) if (existsSync(path.join(dir, "initdb"))) return dir;
  const which = spawnSync("sh", ["-c", "command -v initdb"], { encoding: "utf8" });
  return which.status === 0 ? path.dirname(which.stdout.trim()) : null;
}

function readdirSafe(dir: string): string[] {
  try {
    return readdirSync(dir);
  } catch {
    return [];
  }
}

export function ensurePostgresInstalled(log: (line: string) => void = console.log): string {
  let bin = findBinDir();
  if (bin) return bin;
  if (!isRoot) throw new Error("PostgreSQL is not installed and this is not root: install Debian's `postgresql` package.");
  log("Installing PostgreSQL from Debian's packages (apt-get install -y postgresql)…");
  execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit" });
  execFileSync("apt-get", ["install", "-y", "-qq", "postgresql"], { stdio: "inherit", env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
  bin = findBinDir();
  if (!bin) throw new Error("apt-get installed postgresql but no initdb was found under /usr/lib/postgresql.");
  return bin;
}

function asServerUser(bin: string, tool: string, args: string[], capture = false): string {
  const file = path.join(bin, tool);
  const [cmd, cmdArgs] = isRoot ? ["runuser", ["-u", "postgres", "--", file, ...args]] : [file, args];
  const result = spawnSync(cmd, cmdArgs, { encoding: "utf8", stdio: capture ? "pipe" : ["ignore", "pipe", "pipe"] });
  if (result.status !== 0) {
    throw new Error(`${tool} ${args.join(" ")} failed (exit ${result.status}):\n${result.stderr || result.stdout}`);
  }
  return result.stdout;
}

/** The postgres user must be able to reach the data folder; a clone under a private folder gets one in /var/tmp. */
function usableDataDir(wanted: string): string {
  if (!isRoot) return wanted;
  mkdirSync(wanted, { recursive: true });
  chownSync(wanted, uidOf("postgres"), gidOf("postgres"));
  const probe = spawnSync("runuser", ["-u", "postgres", "--", "test", "-w", wanted]);
  if (probe.status === 0) return wanted;
  const fallback = path.join("/var/tmp", `tareline-pg-${createHash("sha256").update(wanted).digest("hex").slice(0, 12)}`);
  mkdirSync(fallback, { recursive: true });
  chownSync(fallback, uidOf("postgres"), gidOf("postgres"));
  return fallback;
}

function uidOf(user: string): number {
  return Number(execFileSync("id", ["-u", user], { encoding: "utf8" }).trim());
}
function gidOf(user: string): number {
  return Number(execFileSync("id", ["-g", user], { encoding: "utf8" }).trim());
}

export function startCluster(options: ClusterOptions): Cluster {
  const log = options.log ?? console.log;
  const bin = ensurePostgresInstalled(log);
  const dataDir = usableDataDir(options.dataDir);
  if (!existsSync(path.join(dataDir, "PG_VERSION"))) {
    log(`Creating a PostgreSQL cluster in ${dataDir}`);
    asServerUser(bin, "initdb", ["-D", dataDir, "-U", "tareline", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"]);
  }
  const running = spawnSync(isRoot ? "runuser" : path.join(bin, "pg_ctl"), isRoot ? ["-u", "postgres", "--", path.join(bin, "pg_ctl"), "status", "-D", dataDir] : ["status", "-D", dataDir]);
  if (running.status !== 0) {
    log(`Starting PostgreSQL on 127.0.0.1:${options.port}`);
    const serverOptions = `-c listen_addresses=127.0.0.1 -p ${options.port} -c unix_socket_directories='' -c fsync=${process.env.PG_FSYNC ?? "on"}`;
    asServerUser(bin, "pg_ctl", ["start", "-w", "-t", "60", "-D", dataDir, "-l", path.join(dataDir, "server.log"), "-o", serverOptions]);
  }
  const adminUrl = `postgres://tareline@127.0.0.1:${options.port}/postgres`;
  const url = `postgres://tareline@127.0.0.1:${options.port}/${options.database}`;
  return {
    url,
    adminUrl,
    dataDir,
    stop: () => {
      spawnSync(isRoot ? "runuser" : path.join(bin, "pg_ctl"), [...(isRoot ? ["-u", "postgres", "--", path.join(bin, "pg_ctl")] : []), "stop", "-m", "fast", "-D", dataDir], { stdio: "ignore" });
    },
  };
}

export function removeCluster(dataDir: string): void {
  rmSync(dataDir, { recursive: true, force: true });
}

