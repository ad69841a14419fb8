// Local SMTP sink for development and tests: accepts every message on 127.0.0.1:SMTP_SINK_PORT and keeps it as .eml.
import { startSmtpSink } from "@/lib/mail/smtp-sink";

const port = Number(process.env.SMTP_SINK_PORT ?? 2525);
const dir = process.env.SMTP_SINK_DIR ?? ".data/dev/mail";

startSmtpSink({
  port,
  dir,
  onMail: (m) => console.log(`[smtp-sink] ${m.receivedAt.toISOString()} to ${m.to.join(", ")}`),
})
  .then(() => console.log(`[smtp-sink] listening on 127.0.0.1:${port}`))
  .catch((err) => {
    // Another sink may already hold the port (e.g. a second `npm start`): that one keeps working.
    console.error(`[smtp-sink] not started: ${err instanceof Error ? err.message : String(err)}`);
  });
