// `npm test`: typecheck, then unit, integration and browser tests, ending with one summary line.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync } from "node:fs";
import path from "node:path";

const root = path.resolve(import.meta.dirname, "..");
const reports = path.join(root, ".data/test-reports");
mkdirSync(reports, { recursive: true });
const bin = (name: string) => path.join(root, "node_modules/.bin", name);

function run(title: string, command: string, args: string[]): boolean {
  console.log(`\n▸ ${title}`);
  const result = spawnSync(command, args, { cwd: root, stdio: "inherit", env: process.env });
  return result.status === 0;
}

function ensureChromium() {
  const chromium = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
  if (existsSync(chromium)) return;
  if (process.getuid?.() !== 0) throw new Error(`${chromium} is missing: install Debian's chromium package.`);
  console.log("▸ Installing Debian's chromium for the browser tests");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  spawnSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
  const install = spawnSync("apt-get", ["install", "-y", "-qq", "chromium"], { stdio: "inherit", env });
  if (install.status !== 0) throw new Error("apt-get install chromium failed");
}

let passed = 0;
let failed = 0;
let skipped = 0;
let ok = true;

ensureChromium();
ok = run("Typecheck (react-router typegen && tsc)", bin("react-router"), ["typegen"]) && ok;
ok = run("Typecheck: tsc", bin("tsc"), []) && ok;
if (!ok) failed += 1;

for (const project of ["unit", "integration", "e2e"]) {
  const report = path.join(reports, `${project}.json`);
  const fine = run(`Vitest: ${project}`, bin("vitest"), ["run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${report}`]);
  ok = fine && ok;
  if (existsSync(report)) {
    const json = JSON.parse(readFileSync(report, "utf8")) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number };
    passed += json.numPassedTests;
    // A run that failed before or after its tests (setup, teardown) counts as one failure even with no failed test.
    failed += Math.max(json.numFailedTests, fine ? 0 : 1);
    skipped += json.numPendingTests + json.numTodoTests;
  }
  if (!fine && !existsSync(report)) failed += 1;
}

console.log(`\n${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(ok && failed === 0 ? 0 : 1);
