import { z } from "zod";
import { updateOwnMailPreference } from "@/db/queries/account";
import { MAIL_PREFERENCES } from "@/db/schema";
import { readJson, withUser } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

const preferencesSchema = z.object({
  mailPreference: z.enum(MAIL_PREFERENCES, { message: `Mail preference must be one of ${MAIL_PREFERENCES.join(", ")}` }),
});

// PATCH /api/me/preferences – set the caller's own mail preference (immediate, digest or off)
export const PATCH = withUser(null, async ({ req, user }) => {
  const { mailPreference } = preferencesSchema.parse(await readJson(req));
  return Response.json(await updateOwnMailPreference(user.id, mailPreference));
});
