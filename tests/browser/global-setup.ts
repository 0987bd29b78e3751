import type { ChildProcess } from "node:child_process";
import path from "node:path";
import type { TestProject } from "vitest/node";
// @ts-expect-error plain ESM helper shared with `npm start`
import { buildIfNeeded } from "../../scripts/build-if-needed.mjs";
import { prepareDatabase, removeDatabase, startServer, stopServer, type PreparedDatabase } from "./server";

const root = path.resolve(import.meta.dirname, "../..");
let server: ChildProcess | undefined;
let prepared: PreparedDatabase | undefined;

export default async function setup(project: TestProject) {
  prepared = await prepareDatabase();
  const { baseURL, env } = prepared;
  if (prepared.dialect === "postgres") console.log(`browser tests: the app runs on PostgreSQL (${new URL(prepared.databaseUrl!).pathname.slice(1)})`);
  buildIfNeeded(root, env);
  server = await startServer(env, prepared.port);
  project.provide("baseURL", baseURL);
  project.provide("workDir", prepared.dir);
  project.provide("databasePath", prepared.databasePath);
  project.provide("databaseUrl", prepared.databaseUrl ?? "");
  return async () => {
    await stopServer(server);
    await removeDatabase(prepared);
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    baseURL: string;
    workDir: string;
    databasePath: string;
    /** Empty on SQLite. */
    databaseUrl: string;
  }
}
