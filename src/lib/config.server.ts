import { z } from 'zod';

// Every setting the server reads, declared once. .env.example lists the same names.
const configSchema = z.object({
  DATABASE_URL: z.string().url(),
  AUTH_SECRET: z.string().min(16),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(1025),
  MAIL_FROM: z.string().default('Sheathwise <no-reply@sheathwise.invalid>'),
  /** The address people use to reach the app, for links in e-mails. */
  APP_URL: z.string().url().default(`http://127.0.0.1:${process.env.SHEATHWISE_PORT ?? 4321}`),
  MAIL_POLL_SECONDS: z.coerce.number().min(0.5).default(2),
  S3_ENDPOINT: z.string().url(),
  S3_BUCKET: z.string().min(3),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY: z.string().min(1),
  S3_SECRET_KEY: z.string().min(1),
  /** Largest upload accepted, bytes. */
  UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(10 * 1024 * 1024),
  SIGN_IN_MAX_FAILURES: z.coerce.number().int().positive().default(5),
  SIGN_IN_LOCK_SECONDS: z.coerce.number().int().positive().default(300),
});

export type ServerConfig = z.output<typeof configSchema>;

let cached: ServerConfig | undefined;

/** The validated server configuration; throws naming each missing or bad variable. */
export function serverConfig(): ServerConfig {
  if (!cached) {
    const parsed = configSchema.safeParse(process.env);
    if (!parsed.success) {
      const fields = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
      throw new Error(`Server configuration is incomplete. ${fields.join('; ')}`);
    }
    cached = parsed.data;
  }
  return cached;
}
