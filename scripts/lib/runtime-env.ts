// For operator CLIs run outside `npm start` (token, analyze against the DB): fill process.env from the dev
// environment's configuration unless DATABASE_URL is already set.
export async function loadRuntimeEnv(envName: "dev" | "test" = (process.env.HALFMAX_ENV as "dev" | "test") ?? "dev"): Promise<void> {
  if (process.env.DATABASE_URL) return;
  // @ts-expect-error plain ESM helper without types
  const { resolveConfig } = await import("./config.mjs");
  const cfg = resolveConfig(envName) as { runtimeEnv: Record<string, string> };
  for (const [k, v] of Object.entries(cfg.runtimeEnv)) if (k !== "NODE_ENV" && process.env[k] === undefined) process.env[k] = v;
}
