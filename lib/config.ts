import { z } from "zod";

// Every service address comes from the environment (scripts/env.sh sets loopback
// defaults). A missing or malformed variable is reported by name, all at once.
const schema = z.object({
  DATABASE_URL: z.string().url(),
  MIGRATION_DATABASE_URL: z.string().url().optional(),
  REDIS_URL: z.string().url(),
  S3_ENDPOINT: z.string().url().optional(),
  S3_BUCKET: z.string().min(1),
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_ACCESS_KEY_ID: z.string().min(1),
  S3_SECRET_ACCESS_KEY: z.string().min(1),
  S3_FORCE_PATH_STYLE: z.enum(["true", "false"]).default("true"),
  SMTP_URL: z.string().url(),
  MAIL_FROM: z.string().min(3),
  MAIL_VIEW_URL: z.string().url().optional(),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  BANDKEEP_QUEUE: z.string().min(1).default("bandkeep-analysis"),
  UPLOAD_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(20 * 1024 * 1024),
  /** Decision mail to one person waits this long for more decisions, then goes as one message. */
  NOTICE_WINDOW_MS: z.coerce.number().int().min(0).default(60_000),
});

export type AppConfig = z.infer<typeof schema>;

let cached: AppConfig | undefined;

/** Parses the environment with a schema; a missing or malformed variable is named, all at once. */
function readEnvironment<S extends z.ZodType>(shape: S): z.infer<S> {
  const parsed = shape.safeParse(process.env);
  if (!parsed.success) {
    const names = parsed.error.issues.map((i) => `${i.path.join(".")} (${i.message})`).join(", ");
    throw new Error(`Bandkeep is missing or cannot read these environment variables: ${names}. See README.md, "Configuration".`);
  }
  return parsed.data;
}

export function config(): AppConfig {
  cached ??= readEnvironment(schema);
  return cached;
}

const databaseSchema = schema.pick({ DATABASE_URL: true, MIGRATION_DATABASE_URL: true });

/**
 * The database addresses alone, read without filling config()'s cache: the models bind to the
 * connection when they are first imported, and a process (a test) may set its other variables
 * after its imports have run.
 */
export function databaseConfig(): z.infer<typeof databaseSchema> {
  return readEnvironment(databaseSchema);
}
