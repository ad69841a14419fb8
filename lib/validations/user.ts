import { z } from "zod";
import { MAIL_PREFERENCES, ROLES } from "@/db/schema";

export const passwordSchema = z.string().min(10, { message: "Use at least 10 characters" }).max(200);

export const createUserSchema = z.object({
  email: z.string().trim().toLowerCase().email({ message: "Enter a valid e-mail address" }).max(254),
  name: z.string().trim().min(1, { message: "Enter the person's name" }).max(120),
  role: z.enum(ROLES, { message: `Role must be one of ${ROLES.join(", ")}` }),
  /** Leave empty to send an invitation e-mail with a link to choose a password. */
  password: z.union([passwordSchema, z.literal("")]).optional(),
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z.object({
  name: z.string().trim().min(1).max(120).optional(),
  role: z.enum(ROLES).optional(),
  active: z.boolean().optional(),
  mailPreference: z.enum(MAIL_PREFERENCES).optional(),
});
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const createTokenSchema = z.object({
  name: z.string().trim().min(1, { message: "Name the token after the script that uses it" }).max(80),
});
export type CreateTokenInput = z.infer<typeof createTokenSchema>;
