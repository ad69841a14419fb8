// Next.js start-up hook: start the outbox sender and scheduled checks in the Node.js server process.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startBackgroundJobs } = await import("./lib/jobs/background");
  startBackgroundJobs();
}
