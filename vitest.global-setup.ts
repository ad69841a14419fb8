// Builds the analysis worker bundle once before the suites (route tests run analysis in worker threads).
export default async function setup(): Promise<void> {
  // @ts-expect-error plain ESM script without types
  const { buildWorker } = await import("./scripts/build-worker.mjs");
  await buildWorker();
}
