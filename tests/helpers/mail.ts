import { mkdtempSync, readdirSync, readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { startSmtpFake } from "../../scripts/fakes/smtp";

/** Starts the SMTP fake on this test file's SMTP_URL port; returns a reader of the messages it received. */
export async function startOutbox() {
  const port = Number(new URL(process.env.SMTP_URL!).port);
  const outbox = mkdtempSync(path.join(os.tmpdir(), "tareline-outbox-"));
  const server = await startSmtpFake({ port, outbox });
  return {
    messages: () => readdirSync(outbox).sort().map((f) => readFileSync(path.join(outbox, f), "utf8")),
    stop: server.stop,
  };
}
