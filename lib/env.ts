import { z } from "zod";

/** Server configuration, parsed once from the environment. See README "Configuration". */
const envSchema = z.object({
  HALFMAX_ENV: z.enum(["dev", "test"]).default("dev"),
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a mysql:// URL" }),
  NEXTAUTH_SECRET: z.string().min(16).optional(),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  STORAGE_DIR: z.string().default(".data/dev/storage"),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default("Halfmax QA <qa@halfmax.test>"),
  MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(200 * 1024 * 1024),
  MAX_IMAGE_PIXELS: z.coerce.number().int().positive().default(50_000_000),
  DEMO_PASSWORD: z.string().default("halfmax-demo"),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | null = null;

export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const detail = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Invalid configuration: ${detail}`);
  }
  cached = parsed.data;
  return cached;
}
