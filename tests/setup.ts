import crypto from "node:crypto";
import os from "node:os";
import net from "node:net";
import path from "node:path";
import { vi } from "vitest";
import { cookieJar } from "./helpers/cookies";

// Each test file gets its own SQLite file, set before lib/env is first imported.
process.env.DATABASE_PATH ??= path.join(os.tmpdir(), `heatpath-test-${process.pid}-${crypto.randomBytes(4).toString("hex")}.sqlite`);
process.env.HEATPATH_MODE ??= "demo";
// A secret of this run's own, so tests do not write demo mode's generated secret file beside their databases in the temp folder.
process.env.SESSION_SECRET ??= crypto.randomBytes(32).toString("hex");

// `npm run test:postgres` passes a PostgreSQL admin URL instead: each test file
// gets its own new database there, created before lib/env is first imported.
const pgAdminUrl = process.env.HEATPATH_TEST_PG_ADMIN_URL;
if (pgAdminUrl) {
  const { default: pg } = await import("pg");
  const name = `heatpath_test_${process.pid}_${crypto.randomBytes(4).toString("hex")}`;
  const admin = new pg.Client({ connectionString: pgAdminUrl });
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  const url = new URL(pgAdminUrl);
  url.pathname = `/${name}`;
  process.env.DATABASE_URL = url.toString();
}

// A free loopback port for this file's mail catcher, should a test start one.
process.env.MAIL_CATCHER_PORT ??= String(
  await new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  }),
);

// Route handlers and services read the session through next/headers; tests give them a cookie jar.
// Server actions revalidate pages; outside a request there is nothing to revalidate.
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined, updateTag: () => undefined }));

vi.mock("next/headers", () => ({
  cookies: async () => cookieJar,
  headers: async () => new Headers(),
}));
