import type { ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import type { TestProject } from "vitest/node";
// @ts-expect-error plain ESM helper shared with `npm start`
import { buildIfNeeded } from "../../scripts/build-if-needed.mjs";
import { prepareDatabase, startServer, stopServer } from "./server";

const root = path.resolve(import.meta.dirname, "../..");
let server: ChildProcess | undefined;
let workDir: string | undefined;

export default async function setup(project: TestProject) {
  const prepared = await prepareDatabase();
  workDir = prepared.dir;
  const { baseURL, env } = prepared;
  buildIfNeeded(root, env);
  server = await startServer(env, prepared.port);
  project.provide("baseURL", baseURL);
  project.provide("workDir", workDir);
  project.provide("databasePath", prepared.databasePath);
  return async () => {
    await stopServer(server);
    if (workDir) fs.rmSync(workDir, { recursive: true, force: true });
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    baseURL: string;
    workDir: string;
    databasePath: string;
  }
}
