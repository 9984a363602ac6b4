import { z } from "zod";

/** The environment, read and validated once. Nothing else reads process.env. */
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().url().default("postgres://faradsmith@127.0.0.1:54329/faradsmith"),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  BETTER_AUTH_URL: z.string().url().optional(),
  BETTER_AUTH_SECRET: z.string().min(16).default("faradsmith-local-secret-change-me-in-production"),
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(30),
  /** sign-in and sign-up attempts per client per 10 s */
  AUTH_SIGN_IN_LIMIT: z.coerce.number().int().positive().default(3),
  API_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(120),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(1025),
  /** production SMTP: TLS from the first byte ("true", port 465) and credentials; none on loopback */
  SMTP_SECURE: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
  SMTP_USER: z.string().min(1).optional(),
  SMTP_PASSWORD: z.string().min(1).optional(),
  MAIL_FROM: z.string().default("Faradsmith <quotes@faradsmith.example>"),
  /** "off" keeps the e-mail worker out of this server (another process runs it, or none is wanted) */
  MAIL_WORKER: z.enum(["on", "off"]).default("on"),
  MAIL_INBOX_URL: z.string().url().default("http://127.0.0.1:1080"),
  UPLOAD_DIR: z.string().default(".data/uploads"),
});

const parsed = schema.safeParse(process.env);
if (!parsed.success) {
  throw new Error(`Invalid environment: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
}

export const env = {
  ...parsed.data,
  BETTER_AUTH_URL: parsed.data.BETTER_AUTH_URL ?? parsed.data.APP_URL,
};
export type Env = typeof env;
