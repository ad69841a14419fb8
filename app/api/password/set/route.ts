import { z } from "zod";
import { setPasswordWithToken } from "@/db/queries/user-admin";
import { readJson } from "@/lib/api/handler";
import { toErrorResponse } from "@/lib/errors";
import { passwordSchema } from "@/lib/validations/user";

const schema = z.object({ token: z.string().min(10), password: passwordSchema });

// POST /api/password/set – set a password with an invitation or reset token. No auth (the token is the proof).
export async function POST(req: Request): Promise<Response> {
  try {
    const input = schema.parse(await readJson(req));
    await setPasswordWithToken(input.token, input.password);
    return Response.json({ ok: true });
  } catch (err) {
    return toErrorResponse(err);
  }
}
