import { z } from "zod";
import { requestPasswordReset } from "@/db/queries/user-admin";
import { readJson } from "@/lib/api/handler";
import { toErrorResponse } from "@/lib/errors";

const schema = z.object({ email: z.string().trim().email({ message: "Enter a valid e-mail address" }) });

// POST /api/password/reset – queue a password-reset e-mail (same answer whether or not the account exists). No auth.
export async function POST(req: Request): Promise<Response> {
  try {
    await requestPasswordReset(schema.parse(await readJson(req)).email);
    return Response.json({ ok: true, message: "If that address has an account, a reset link is on its way." }, { status: 202 });
  } catch (err) {
    return toErrorResponse(err);
  }
}
