/**
 * npm run bench:api — HTTP throughput of the app under `next start` on 127.0.0.1, and the
 * first-load JavaScript of the case page, against the budgets:
 *   POST /api/v1/evaluate (500 temperatures, ?format=columns) ≥ 0.5 × the requests/s of a bare health route
 *   (the row format is measured beside it, for comparison);
 *   the case page's results request for a 10 000-point case < 250 ms (median of sequential requests,
 *   a live draft and a frozen snapshot, rows and columns);
 *   first-load JS of the case page ≤ 250 kB gzip.
 * Bounded: 16 connections, a few seconds per target, loopback only. Reports figures, never fails on them.
 */
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import zlib from "node:zlib";
import autocannon from "autocannon";
// @ts-expect-error plain ESM helper shared with `npm start`
import { buildIfNeeded } from "../scripts/build-if-needed.mjs";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { nasa7Gas, root } from "./reference";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 8);
const CONNECTIONS = 16;

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function waitFor(url: string) {
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // starting
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no answer from ${url}`);
}

type Run = { rps: number; p50: number; p95: number; non2xx: number };

async function load(url: string, options: { method?: "GET" | "POST"; body?: string; headers?: Record<string, string> } = {}): Promise<Run> {
  const result = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, method: options.method ?? "GET", body: options.body, headers: options.headers });
  const latency = result.latency as unknown as { p50: number; p97_5: number; p90: number };
  return { rps: result.requests.average, p50: latency.p50, p95: (latency.p90 + latency.p97_5) / 2, non2xx: result.non2xx };
}

/** Gzip size of the JS a page loads first: the root main files plus the entry chunks of its layouts and page. */
function firstLoadJs(manifestFile: string, entries: string[]): { files: number; gzipBytes: number } {
  const holder = globalThis as { __RSC_MANIFEST?: Record<string, { entryJSFiles: Record<string, string[]> }> };
  holder.__RSC_MANIFEST = {};
  // The manifest is a script that assigns to globalThis.
  new Function(fs.readFileSync(manifestFile, "utf8"))();
  const manifest = Object.values(holder.__RSC_MANIFEST)[0];
  const build = JSON.parse(fs.readFileSync(path.join(root, ".next/build-manifest.json"), "utf8")) as { rootMainFiles: string[] };
  const files = new Set<string>(build.rootMainFiles);
  for (const [entry, chunks] of Object.entries(manifest.entryJSFiles)) {
    if (entries.some((e) => entry.endsWith(e))) chunks.forEach((c) => files.add(c));
  }
  let gzipBytes = 0;
  for (const f of files) gzipBytes += zlib.gzipSync(fs.readFileSync(path.join(root, ".next", f.replace(/^\/?_next\//, "")))).length;
  return { files: files.size, gzipBytes };
}

function findCasePageManifest(): { file: string; entries: string[] } {
  const candidates = ["(app)/cases/[id]", "(app)/cases"];
  for (const c of candidates) {
    const file = path.join(root, ".next/server/app", c, "page_client-reference-manifest.js");
    if (fs.existsSync(file)) return { file, entries: ["app/layout", "app/(app)/layout", `app/${c}/page`] };
  }
  throw new Error("no case page in the build");
}

/** Median wall time of `n` sequential requests (after one discarded warm-up), and the answer's size. */
async function timed(url: string, headers: Record<string, string>, n = 9, init: { method?: string; body?: string } = {}): Promise<{ ms: number; bytes: number }> {
  let bytes = 0;
  const times: number[] = [];
  for (let i = 0; i <= n; i++) {
    const t0 = performance.now();
    const r = await fetch(url, { headers, ...init });
    const text = await r.text();
    if (!r.ok) throw new Error(`${url}: ${r.status} ${text.slice(0, 200)}`);
    if (i > 0) times.push(performance.now() - t0);
    bytes = text.length;
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(times.length / 2)], bytes };
}

async function main() {
  buildIfNeeded(root);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-bench-"));
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const env = { ...process.env, HEATPATH_MODE: "demo", DATABASE_PATH: path.join(dir, "bench.sqlite"), APP_URL: base, MAIL_CATCHER_PORT: String(await freePort()), SIGNIN_LIMIT_PER_ADDRESS: "100000" };
  for (const step of ["migrate", "seed"]) spawnSync(path.join(root, "node_modules/.bin/tsx"), ["scripts/db.ts", step], { cwd: root, env, stdio: "ignore" });
  const server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], { cwd: root, env, stdio: "ignore" });
  try {
    await waitFor(`${base}/api/v1/health`);
    const signIn = await fetch(`${base}/api/v1/session`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: "erin.engineer@example.test", password: DEMO_PASSWORD }) });
    const cookie = signIn.headers.get("set-cookie")!.split(";")[0];
    const body = JSON.stringify({
      reaction: "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)",
      species: Object.fromEntries(["CH4", "H2O", "CO", "H2"].map((s) => [`${s}(g)`, nasa7Gas(s)])),
      temperatures: { fromK: 500, toK: 1498, stepK: 2 },
    });
    const check = await fetch(`${base}/api/v1/evaluate`, { method: "POST", headers: { "content-type": "application/json", cookie }, body });
    const points = ((await check.json()) as { points: unknown[] }).points.length;

    await load(`${base}/api/v1/health`); // warm-up, discarded
    const health = await load(`${base}/api/v1/health`);
    const me = await load(`${base}/api/v1/me`, { headers: { cookie } });
    const evaluate = await load(`${base}/api/v1/evaluate`, { method: "POST", body, headers: { "content-type": "application/json", cookie } });
    const columns = await load(`${base}/api/v1/evaluate?format=columns`, { method: "POST", body, headers: { "content-type": "application/json", cookie } });
    const rowBytes = (await (await fetch(`${base}/api/v1/evaluate`, { method: "POST", headers: { "content-type": "application/json", cookie }, body })).text()).length;
    const columnBytes = (await (await fetch(`${base}/api/v1/evaluate?format=columns`, { method: "POST", headers: { "content-type": "application/json", cookie }, body })).text()).length;

    // One request at a time: what the server spends, with the load generator out of the way.
    const post = { method: "POST", body };
    const json = { "content-type": "application/json", cookie };
    const single = { health: await timed(`${base}/api/v1/health`, {}, 29), rows: await timed(`${base}/api/v1/evaluate`, json, 29, post), columns: await timed(`${base}/api/v1/evaluate?format=columns`, json, 29, post) };

    // A 10 000-point case: a seeded draft's reaction and pins over 300–1299.9 K in 0.1 K steps.
    const list = (await (await fetch(`${base}/api/v1/cases?status=draft`, { headers: { cookie } })).json()) as { cases: { id: number }[] };
    const seeded = (await (await fetch(`${base}/api/v1/cases/${list.cases[0].id}/results`, { headers: { cookie } })).json()) as { inputs: Record<string, unknown> };
    const inputs = { ...seeded.inputs, title: "Bench: 10 000 temperatures", temperatures: { fromK: 300, toK: 1299.9, stepK: 0.1 }, equilibrium: null };
    const created = await fetch(`${base}/api/v1/cases`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(inputs) });
    if (created.status !== 201) throw new Error(`could not create the 10 000-point case: ${created.status} ${await created.text()}`);
    const big = ((await created.json()) as { case: { id: number; lockVersion: number } }).case;
    const resultsUrl = `${base}/api/v1/cases/${big.id}/results`;
    const bigPoints = ((await (await fetch(resultsUrl, { headers: { cookie } })).json()) as { result: { points: unknown[] } }).result.points.length;
    const live = { rows: await timed(resultsUrl, { cookie }), columns: await timed(`${resultsUrl}?format=columns`, { cookie }) };
    const submitted = await fetch(`${base}/api/v1/cases/${big.id}/submit`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify({ lockVersion: big.lockVersion }) });
    if (submitted.status !== 200) throw new Error(`could not submit the 10 000-point case: ${submitted.status} ${await submitted.text()}`);
    const frozen = { rows: await timed(resultsUrl, { cookie }), columns: await timed(`${resultsUrl}?format=columns`, { cookie }) };
    const js = (() => {
      try {
        return firstLoadJs(findCasePageManifest().file, findCasePageManifest().entries);
      } catch (e) {
        return { files: 0, gzipBytes: NaN, error: (e as Error).message };
      }
    })();

    const row = (name: string, r: Run) => `| ${name} | ${r.rps.toFixed(0)} | ${r.p50.toFixed(1)} | ${r.p95.toFixed(1)} | ${r.non2xx} |`;
    console.log(`\nHeatpath API benchmark — ${CONNECTIONS} connections, ${SECONDS} s per target, next start on 127.0.0.1 (${os.cpus().length} cores, load average ${os.loadavg()[0].toFixed(1)} at the end), ${new Date().toISOString().slice(0, 16)}Z\n`);
    console.log("| target | requests/s | p50 ms | p95 ms | non-2xx |\n|---|---|---|---|---|");
    console.log(row("GET /api/v1/health", health));
    console.log(row("GET /api/v1/me (session + membership lookup)", me));
    console.log(row(`POST /api/v1/evaluate (${points} points, 4 species, NASA-7), rows`, evaluate));
    console.log(row(`POST /api/v1/evaluate?format=columns (${points} points)`, columns));
    const ratio = columns.rps / health.rps;
    console.log(`\nanswer size, ${points} points: rows ${(rowBytes / 1024).toFixed(0)} kB, columns ${(columnBytes / 1024).toFixed(0)} kB`);
    console.log(`evaluate (columns) / health throughput: ${ratio.toFixed(2)} (target ≥ 0.5: ${ratio >= 0.5 ? "met" : "not met"}); rows: ${(evaluate.rps / health.rps).toFixed(2)}`);
    console.log(`one request at a time (median of 29): health ${single.health.ms.toFixed(1)} ms, evaluate rows ${single.rows.ms.toFixed(1)} ms, columns ${single.columns.ms.toFixed(1)} ms`);
    const ms = (t: { ms: number; bytes: number }) => `${t.ms.toFixed(0)} ms (${(t.bytes / 1024).toFixed(0)} kB)`;
    const verdict = (t: { ms: number }) => (t.ms < 250 ? "met" : "not met");
    console.log(`\ncase results request, ${bigPoints}-point case, median of 9 sequential (target < 250 ms):`);
    console.log(`  live draft (evaluated per request): rows ${ms(live.rows)}: ${verdict(live.rows)}; columns ${ms(live.columns)}: ${verdict(live.columns)}`);
    console.log(`  frozen snapshot (read from the database): rows ${ms(frozen.rows)}: ${verdict(frozen.rows)}; columns ${ms(frozen.columns)}: ${verdict(frozen.columns)}`);
    console.log(`first-load JS of the case page: ${(js.gzipBytes / 1024).toFixed(1)} kB gzip in ${js.files} files (target ≤ 250 kB: ${js.gzipBytes <= 250 * 1024 ? "met" : "not met"})`);
  } finally {
    server.kill("SIGKILL");
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : String(e));
  process.exit(1);
});
