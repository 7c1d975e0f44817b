import { z } from "zod";

/**
 * The environment, read once and validated. Import `env` instead of reading process.env.
 * Outside development a missing NEXTAUTH_SECRET stops the start with a clear message.
 */
// `next build` evaluates modules without the runtime secrets; the running server checks them (instrumentation.ts).
const relaxed = (source: Record<string, string | undefined>) =>
  source.NODE_ENV !== "production" || source.NEXT_PHASE === "phase-production-build";

const schemaFor = (isDev: boolean) => z.object({
  NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
  NEXTAUTH_URL: z.url().default("http://localhost:3000"),
  NEXTAUTH_SECRET: isDev
    ? z.string().min(16).default("development-only-secret-not-for-use")
    : z.string({ error: "NEXTAUTH_SECRET is required outside development: set it to a long random string (npm start generates one in .data/secret)" }).min(16, "NEXTAUTH_SECRET must be at least 16 characters"),
  DB_HOST: z.string().default("127.0.0.1"),
  DB_PORT: z.coerce.number().int().positive().default(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/).default("yawpoint"),
  DB_USER: z.string().default("yawpoint"),
  DB_PASSWORD: z.string().default("yawpoint-local"),
  /** The database's owner, who runs the migrations; the application (DB_USER) cannot change the schema or the audit log. */
  DB_OWNER_USER: z.string().default("yawpoint_owner"),
  DB_OWNER_PASSWORD: z.string().default("yawpoint-owner-local"),
  /** Largest number of database connections the server's pool opens. */
  DB_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  /** How many reverse proxies in front of the server append to X-Forwarded-For; 0 (the default): the header is ignored. */
  TRUSTED_PROXY_HOPS: z.coerce.number().int().min(0).max(10).default(0),
  /** Sequence uploads one session link may send per minute (lib/auth/rate-limit.ts); more are answered 429 and retried by the runner. */
  UPLOAD_LIMIT_PER_MINUTE: z.coerce.number().int().min(1).max(100_000).default(120),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
  MAIL_FROM: z.string().default("Yawpoint <no-reply@yawpoint.invalid>"),
  MAIL_FAKE_HTTP_PORT: z.coerce.number().int().positive().default(2580),
  /** Mail goes to the local SMTP fake, whose messages the admin can read: the default in development only. */
  MAIL_FAKE: z.enum(["true", "false"]).default(isDev ? "true" : "false").transform((v) => v === "true"),
  /** Key material for participant identities at rest (AES-256-GCM; the key is SHA-256 of this string). */
  PARTICIPANT_DATA_KEY: isDev
    ? z.string().min(16).default("development-only-participant-data-key")
    : z.string({ error: "PARTICIPANT_DATA_KEY is required outside development: set it to a long random string (npm start generates one in .data/data-key)" }).min(16, "PARTICIPANT_DATA_KEY must be at least 16 characters"),
  /** Key of the audit chain's HMAC (lib/data/audit.ts); kept outside the database, so the database alone cannot forge entries. */
  AUDIT_KEY: isDev
    ? z.string().min(16).default("development-only-audit-key")
    : z.string({ error: "AUDIT_KEY is required outside development: set it to a long random string (npm start generates one in .data/audit-key)" }).min(16, "AUDIT_KEY must be at least 16 characters"),
  STORAGE_DIR: z.string().default("./storage"),
  /** When set, protocol documents go to this S3-compatible bucket instead of STORAGE_DIR. */
  S3_BUCKET: z.string().optional(),
  S3_ENDPOINT: z.url().optional(),
  S3_REGION: z.string().default("us-east-1"),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  S3_FORCE_PATH_STYLE: z.enum(["true", "false"]).default("true").transform((v) => v === "true"),
  EXPORTS_DIR: z.string().default("./exports"),
  /** How many export jobs run at once on this server, whatever the number of studies (lib/data/exportQueue.ts); the rest wait their turn. */
  EXPORT_CONCURRENCY: z.coerce.number().int().min(1).max(16).default(2),
  /** Days a finished archive's file is kept; then it is deleted and the listing says so (lib/data/exportQueue.ts). */
  EXPORT_RETENTION_DAYS: z.coerce.number().int().min(1).max(3650).default(30),
  /** Seconds a running export may go without a sign of life (its process beats every 10 s) before it is failed as lost with its server (lib/data/exportQueue.ts). */
  EXPORT_STALE_SECONDS: z.coerce.number().int().min(30).max(3600).default(120),
});

export type Env = z.infer<ReturnType<typeof schemaFor>>;

export function parseEnv(source: Record<string, string | undefined>): Env {
  const result = schemaFor(relaxed(source)).safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join("\n")}`);
  }
  return result.data;
}

export const env: Env = parseEnv(process.env);
