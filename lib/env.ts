import { z } from "zod";

/** The development secret: fine on a laptop, refused in production mode. */
export const DEVELOPMENT_SESSION_SECRET = "heatpath-development-secret-change-me-0000000000";

const schema = z.object({
  HEATPATH_MODE: z.enum(["demo", "production"]).default("demo"),
  DATABASE_PATH: z.string().min(1).default("data/heatpath.sqlite"),
  DATABASE_URL: z.string().optional(),
  SESSION_SECRET: z.string().min(32, "SESSION_SECRET must be at least 32 characters").default(DEVELOPMENT_SESSION_SECRET),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  SMTP_URL: z.string().optional(),
  MAIL_CATCHER_PORT: z.coerce.number().int().positive().default(2525),
  MAIL_FROM: z.string().default("Heatpath <no-reply@heatpath.example.test>"),
  BODY_LIMIT_BYTES: z.coerce.number().int().positive().default(1_048_576),
  LOG_SQL: z.enum(["0", "1"]).default("0"),
  SIGNIN_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(10),
  SIGNIN_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(50),
  SIGNIN_WINDOW_SECONDS: z.coerce.number().int().positive().default(900),
  ENGINE_THREADS: z.coerce.number().int().min(1).max(64).default(2),
  ENGINE_TIME_LIMIT_MS: z.coerce.number().int().positive().default(10_000),
  ENGINE_QUEUE_LIMIT: z.coerce.number().int().min(0).default(8),
});

export type Env = z.infer<typeof schema>;

function read(): Env {
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new Error(`Invalid environment: ${first.path.join(".")}: ${first.message}`);
  }
  return parsed.data;
}

/** Environment, read and checked once per process. */
export const env: Env = read();

export const isProduction = env.HEATPATH_MODE === "production";

/**
 * Problems that stop production mode from starting. Demo accounts are checked
 * separately, since that needs the database.
 */
export function productionConfigProblems(e: Env = env): string[] {
  if (e.HEATPATH_MODE !== "production") return [];
  const problems: string[] = [];
  if (e.SESSION_SECRET === DEVELOPMENT_SESSION_SECRET) problems.push("SESSION_SECRET is the development secret");
  if (!e.SMTP_URL) problems.push("SMTP_URL is required in production mode");
  return problems;
}
