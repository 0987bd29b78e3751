import { z } from "zod";

const ipAddress = z.union([z.ipv4(), z.ipv6()]);
/** True for an IPv4 or IPv6 address (zod, not node:net: client components import this file's schema neighbours). */
export const isIpAddress = (value: string) => ipAddress.safeParse(value).success;

/**
 * The secret that earlier copies of `.env.example` printed. Known to everyone, so it is
 * refused in every mode (demo mode generates its own secret instead: lib/session-secret.ts).
 */
export const DEVELOPMENT_SESSION_SECRET = "heatpath-development-secret-change-me-0000000000";

const schema = z.object({
  HEATPATH_MODE: z.enum(["demo", "production"]).default("demo"),
  DATABASE_PATH: z.string().min(1).default("data/heatpath.sqlite"),
  DATABASE_URL: z.string().optional(),
  SESSION_SECRET: z.string().min(32, "SESSION_SECRET must be at least 32 characters").optional(),
  // Required in production; in demo mode the default is the address this server listens on (see below).
  APP_URL: z.string().url().optional(),
  SMTP_URL: z.string().optional(),
  MAIL_CATCHER_PORT: z.coerce.number().int().positive().default(2525),
  MAIL_FROM: z.string().default("Heatpath <no-reply@heatpath.example.test>"),
  BODY_LIMIT_BYTES: z.coerce.number().int().positive().default(1_048_576),
  LOG_SQL: z.enum(["0", "1"]).default("0"),
  // Failures per account from one address; the account as a whole has a much higher ceiling.
  SIGNIN_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(10),
  SIGNIN_CEILING_PER_ACCOUNT: z.coerce.number().int().positive().default(200),
  SIGNIN_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(50),
  // Unset: the socket address. A number of proxy hops, or a comma-separated list of proxy addresses (lib/auth/client.ts).
  TRUST_PROXY: z
    .string()
    .trim()
    .default("")
    .refine((v) => v === "" || /^\d{1,2}$/.test(v) || v.split(",").every((a) => isIpAddress(a.trim())), {
      message: "TRUST_PROXY must be a number of proxy hops or a comma-separated list of proxy IP addresses",
    }),
  SIGNIN_WINDOW_SECONDS: z.coerce.number().int().positive().default(900),
  ENGINE_THREADS: z.coerce.number().int().min(1).max(64).default(2),
  ENGINE_TIME_LIMIT_MS: z.coerce.number().int().positive().default(10_000),
  ENGINE_QUEUE_LIMIT: z.coerce.number().int().min(0).default(32),
});

/** APP_URL is always a string: "" in production when it was not set (refused by productionConfigProblems). */
export type Env = Omit<z.infer<typeof schema>, "APP_URL"> & { APP_URL: string };

/**
 * The demo default for APP_URL: the host and port this server listens on. `npm start` passes
 * HOST and PORT to the server; `next start -p N` sets PORT itself before the app code loads.
 * A wildcard address (0.0.0.0, ::) is not an address to link to, so it becomes 127.0.0.1.
 */
export function demoAppUrl(source: Record<string, string | undefined> = process.env): string {
  const host = source.HOST && !["0.0.0.0", "::", "[::]"].includes(source.HOST) ? source.HOST : "127.0.0.1";
  const port = source.PORT && /^\d+$/.test(source.PORT) ? source.PORT : "3000";
  return `http://${host.includes(":") && !host.startsWith("[") ? `[${host}]` : host}:${port}`;
}

export function readEnv(source: Record<string, string | undefined> = process.env): Env {
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new Error(`Invalid environment: ${first.path.join(".")}: ${first.message}`);
  }
  const data = parsed.data;
  return { ...data, APP_URL: data.APP_URL ?? (data.HEATPATH_MODE === "production" ? "" : demoAppUrl(source)) };
}

function read(): Env {
  return readEnv(process.env);
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
  if (!e.SESSION_SECRET) problems.push("SESSION_SECRET is required in production mode");
  else if (e.SESSION_SECRET === DEVELOPMENT_SESSION_SECRET) problems.push("SESSION_SECRET is the example secret from .env.example");
  if (!e.APP_URL) problems.push("APP_URL is required in production mode (the public address used in mail links)");
  if (!e.SMTP_URL) problems.push("SMTP_URL is required in production mode");
  return problems;
}
