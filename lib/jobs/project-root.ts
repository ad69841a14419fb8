/**
 * The directory the server runs from (npm scripts start it in the project root). Read through a variable so the
 * bundler's file tracing does not take `process.cwd()` paths as a reason to include the whole project.
 */
export function projectRoot(): string {
  const cwd = process["cwd" as keyof NodeJS.Process] as () => string;
  return process.env.HALFMAX_ROOT ?? cwd.call(process);
}
