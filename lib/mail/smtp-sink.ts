import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { SMTPServer } from "smtp-server";

export interface ReceivedMail {
  from: string;
  to: string[];
  raw: string;
  receivedAt: Date;
}

/**
 * A real SMTP server that accepts every message (no auth, no TLS) and keeps it: the local "sink" used in development
 * and tests instead of a real mail relay. Optionally writes each message as an .eml file into `dir`.
 */
export async function startSmtpSink(opts: { port: number; host?: string; dir?: string; onMail?: (m: ReceivedMail) => void }) {
  const received: ReceivedMail[] = [];
  if (opts.dir) mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const mail: ReceivedMail = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
          to: session.envelope.rcptTo.map((r) => r.address),
          raw: Buffer.concat(chunks).toString("utf8"),
          receivedAt: new Date(),
        };
        received.push(mail);
        if (opts.dir) {
          const name = `${mail.receivedAt.toISOString().replace(/[:.]/g, "-")}-${received.length}.eml`;
          writeFileSync(path.join(opts.dir, name), mail.raw);
        }
        opts.onMail?.(mail);
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, opts.host ?? "127.0.0.1", () => resolve());
  });
  return {
    received,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
