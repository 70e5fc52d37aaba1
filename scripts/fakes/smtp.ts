// The local SMTP fake: accepts every message and writes it to an outbox folder as an .eml file.
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { SMTPServer } from "smtp-server";

export async function startSmtpFake({ port, host = "127.0.0.1", outbox }: { port: number; host?: string; outbox: string }) {
  mkdirSync(outbox, { recursive: true });
  let sequence = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (chunk: Buffer) => chunks.push(chunk));
      stream.on("end", () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, "-")}-${String(++sequence).padStart(4, "0")}.eml`;
        writeFileSync(path.join(outbox, name), Buffer.concat(chunks));
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => resolve());
  });
  return { stop: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
