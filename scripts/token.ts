// `npm run --silent token -- <email> [name]`: create a personal API token for a user and print it (only the token, on stdout).
import { closeDb } from "@/db/client";
import { createApiToken } from "@/db/queries/tokens";
import { getUserByEmail } from "@/db/queries/users";
import { loadRuntimeEnv } from "./lib/runtime-env";

async function main(): Promise<number> {
  await loadRuntimeEnv();
  const [email, name = "command-line token"] = process.argv.slice(2);
  if (!email) {
    console.error("usage: npm run --silent token -- <email> [token name]");
    return 2;
  }
  const user = await getUserByEmail(email);
  if (!user || !user.active) {
    console.error(`halfmax token: no active user with e-mail ${email}`);
    return 2;
  }
  const { token } = await createApiToken(user.id, name);
  process.stdout.write(`${token}\n`);
  return 0;
}

main()
  .then(async (code) => {
    await closeDb();
    process.exit(code);
  })
  .catch(async (err) => {
    console.error(`halfmax token: ${err instanceof Error ? err.message : String(err)}`);
    await closeDb().catch(() => {});
    process.exit(1);
  });
