/**
 * npm run bench:api — HTTP figures of the app under `next start` on 127.0.0.1, each printed
 * beside its target (the rows map 1:1 onto README's Performance table for `npm run bench:api`):
 *   POST /api/v1/evaluate (500 temperatures, ?format=columns) ≥ 0.5 × the requests/s of a bare health route
 *   at 16 connections (rows and GET /api/v1/me beside it, for comparison);
 *   the case page's results request for a 10 000-point case < 250 ms, as the page asks it
 *   (format=columns, the 1 200-point drawing sample and the first table page), p50 and p99 of
 *   sequential requests, a frozen snapshot and a live draft (the whole answer beside it, for comparison);
 *   first-load JS of the case page ≤ 250 kB gzip;
 *   while one member's heavy evaluation runs, GET /api/v1/health and a small evaluate answer in < 1 s
 *   (the engine runs in worker threads, lib/engine-pool.ts).
 * A miss is printed as a miss with what the bench measured about its cause (CPU per request of the
 * server's threads, read from /proc). Bounded: 16 connections, a few seconds per target, loopback
 * only. Reports figures, never fails on them.
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
import { heavyRequest, smallRequest } from "../tests/helpers/heavy";
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

/** CPU seconds (user + system) of a process, all its threads or its main thread only; null where /proc is not there. */
function cpuSeconds(pid: number, mainThreadOnly = false): number | null {
  try {
    const stat = fs.readFileSync(mainThreadOnly ? `/proc/${pid}/task/${pid}/stat` : `/proc/${pid}/stat`, "utf8");
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return null;
  }
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

/** Requests/s, latency, and the server's CPU per request (ms: all threads, and its main thread alone). */
type Run = { rps: number; p50: number; p95: number; non2xx: number; cpuMs: number | null; mainMs: number | null };

let serverPid = 0;

async function load(url: string, options: { method?: "GET" | "POST"; body?: string; headers?: Record<string, string> } = {}): Promise<Run> {
  const all0 = cpuSeconds(serverPid);
  const main0 = cpuSeconds(serverPid, true);
  const result = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, method: options.method ?? "GET", body: options.body, headers: options.headers });
  const all1 = cpuSeconds(serverPid);
  const main1 = cpuSeconds(serverPid, true);
  const perRequest = (a: number | null, b: number | null) => (a === null || b === null || !result.requests.total ? null : ((b - a) * 1000) / result.requests.total);
  const latency = result.latency as unknown as { p50: number; p97_5: number; p90: number };
  return {
    rps: result.requests.average,
    p50: latency.p50,
    p95: (latency.p90 + latency.p97_5) / 2,
    non2xx: result.non2xx,
    cpuMs: perRequest(all0, all1),
    mainMs: perRequest(main0, main1),
  };
}

/** p50 and max of a few sequential timings. */
function spread(xs: number[]): string {
  const sorted = [...xs].sort((a, b) => a - b);
  return `p50 ${sorted[Math.floor(sorted.length / 2)].toFixed(0)} ms, max ${sorted[sorted.length - 1].toFixed(0)} ms`;
}

/** What the case page asks for in one request per view (lib/api + components/results: the drawing sample and the first table page). */
const PAGE_QUERY = "format=columns&points=1200&offset=0&limit=50";

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

type Timed = { ms: number; p99: number; first: number; bytes: number };

/**
 * Wall times of `n` sequential requests after a first one that is reported apart (for a frozen
 * snapshot it is the one that reads it from the database): median and p99 (nearest rank), and
 * the answer's size. The client asks for gzip, as a browser does.
 */
async function timed(url: string, headers: Record<string, string>, n = 9, init: { method?: string; body?: string } = {}): Promise<Timed> {
  let bytes = 0;
  let first = 0;
  const times: number[] = [];
  for (let i = 0; i <= n; i++) {
    const t0 = performance.now();
    const r = await fetch(url, { headers, ...init });
    const text = await r.text();
    if (!r.ok) throw new Error(`${url}: ${r.status} ${text.slice(0, 200)}`);
    if (i > 0) times.push(performance.now() - t0);
    else first = performance.now() - t0;
    bytes = text.length;
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(times.length / 2)], p99: times[Math.min(times.length - 1, Math.ceil(0.99 * times.length) - 1)], first, bytes };
}

async function main() {
  buildIfNeeded(root);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-bench-"));
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const env = {
    ...process.env,
    HEATPATH_MODE: "demo",
    DATABASE_PATH: path.join(dir, "bench.sqlite"),
    APP_URL: base,
    MAIL_CATCHER_PORT: String(await freePort()),
    SIGNIN_LIMIT_PER_ADDRESS: "100000",
  };
  for (const step of ["migrate", "seed"]) spawnSync(path.join(root, "node_modules/.bin/tsx"), ["scripts/db.ts", step], { cwd: root, env, stdio: "ignore" });
  const server = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], { cwd: root, env, stdio: "ignore" });
  serverPid = server.pid ?? 0;
  const loadAtStart = os.loadavg()[0];
  try {
    await waitFor(`${base}/api/v1/health`);
    const signIn = await fetch(`${base}/api/v1/session`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: "erin.engineer@example.test", password: DEMO_PASSWORD }),
    });
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
    const columnBytes = (await (await fetch(`${base}/api/v1/evaluate?format=columns`, { method: "POST", headers: { "content-type": "application/json", cookie }, body })).text())
      .length;

    // One request at a time: what the server spends, with the load generator out of the way.
    const post = { method: "POST", body };
    const json = { "content-type": "application/json", cookie };
    const single = {
      health: await timed(`${base}/api/v1/health`, {}, 29),
      rows: await timed(`${base}/api/v1/evaluate`, json, 29, post),
      columns: await timed(`${base}/api/v1/evaluate?format=columns`, json, 29, post),
    };

    // A 10 000-point case: a seeded draft's reaction and pins over 300–1299.9 K in 0.1 K steps.
    const list = (await (await fetch(`${base}/api/v1/cases?status=draft`, { headers: { cookie } })).json()) as { cases: { id: number }[] };
    const seeded = (await (await fetch(`${base}/api/v1/cases/${list.cases[0].id}/results`, { headers: { cookie } })).json()) as { inputs: Record<string, unknown> };
    const inputs = { ...seeded.inputs, title: "Bench: 10 000 temperatures", temperatures: { fromK: 300, toK: 1299.9, stepK: 0.1 }, equilibrium: null };
    const created = await fetch(`${base}/api/v1/cases`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(inputs) });
    if (created.status !== 201) throw new Error(`could not create the 10 000-point case: ${created.status} ${await created.text()}`);
    const big = ((await created.json()) as { case: { id: number; lockVersion: number } }).case;
    const resultsUrl = `${base}/api/v1/cases/${big.id}/results`;
    const whole = (await (await fetch(resultsUrl, { headers: { cookie } })).json()) as { request: unknown; result: { points: unknown[] } };
    const bigPoints = whole.result.points.length;
    // The case page's one request per view (components/results: the drawing sample and the numbers table's first page).
    const pageAsks = await fetch(`${resultsUrl}?${PAGE_QUERY}`, { headers: { cookie } });
    await pageAsks.arrayBuffer();
    const pageQuery = pageAsks.ok ? PAGE_QUERY : "format=columns";
    const pageNote = pageAsks.ok ? `\`${PAGE_QUERY}\`` : `\`format=columns\` (the route refused \`${PAGE_QUERY}\` with ${pageAsks.status}: whole columns instead)`;
    // The engine's share of a live draft: the same 10 000-point request through POST /api/v1/evaluate.
    const bigEvaluate = await timed(`${base}/api/v1/evaluate?format=columns`, json, 9, { method: "POST", body: JSON.stringify(whole.request) });
    const live = {
      page: await timed(`${resultsUrl}?${pageQuery}`, { cookie }, 30),
      columns: await timed(`${resultsUrl}?format=columns`, { cookie }),
      rows: await timed(resultsUrl, { cookie }),
    };
    const submitted = await fetch(`${base}/api/v1/cases/${big.id}/submit`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify({ lockVersion: big.lockVersion }),
    });
    if (submitted.status !== 200) throw new Error(`could not submit the 10 000-point case: ${submitted.status} ${await submitted.text()}`);
    const frozen = {
      page: await timed(`${resultsUrl}?${pageQuery}`, { cookie }, 60),
      columns: await timed(`${resultsUrl}?format=columns`, { cookie }),
      rows: await timed(resultsUrl, { cookie }),
    };
    const stall = await duringHeavy(base, cookie);
    const js = (() => {
      try {
        return firstLoadJs(findCasePageManifest().file, findCasePageManifest().entries);
      } catch (e) {
        return { files: 0, gzipBytes: NaN, error: (e as Error).message };
      }
    })();

    const verdict = (ok: boolean) => (ok ? "met" : "**not met**");
    const kB = (bytes: number) => `${(bytes / 1024).toFixed(0)} kB`;
    const rps = (r: Run) => `${r.rps.toFixed(0)} requests/s, p50 ${r.p50.toFixed(0)} ms`;
    const cpu = (r: Run) => (r.cpuMs === null ? "n/a" : `${r.cpuMs.toFixed(2)} ms (main thread ${r.mainMs!.toFixed(2)} ms)`);
    const ratio = columns.rps / health.rps;
    const page = (t: Timed) => `p50 ${t.ms.toFixed(0)} ms, p99 ${t.p99.toFixed(0)} ms (${kB(t.bytes)}; first request ${t.first.toFixed(0)} ms)`;
    const pageMet = (t: Timed) => t.ms < 250 && t.p99 < 250;
    const endLoad = os.loadavg()[0];
    const rows: [string, string, string][] = [
      ["`GET /api/v1/health`", rps(health), "—"],
      ["`GET /api/v1/me` (session and membership lookup, for comparison)", `${rps(me)}: ${(me.rps / health.rps).toFixed(2)} × health`, "—"],
      [`\`POST /api/v1/evaluate\`, ${points} points, 4 species, rows (${kB(rowBytes)} answer)`, `${rps(evaluate)}: ${(evaluate.rps / health.rps).toFixed(2)} × health`, "—"],
      [
        `\`POST /api/v1/evaluate?format=columns\`, ${points} points (${kB(columnBytes)} answer)`,
        `${rps(columns)}: ${ratio.toFixed(2)} × health: ${verdict(ratio >= 0.5)}`,
        "≥ 0.5 × health",
      ],
      [`case results request as the case page asks it (${pageNote}), ${bigPoints}-point frozen snapshot`, `${page(frozen.page)}: ${verdict(pageMet(frozen.page))}`, "< 250 ms"],
      [`the same, ${bigPoints}-point live draft (evaluated per request)`, `${page(live.page)}: ${verdict(pageMet(live.page))}`, "< 250 ms"],
      [
        `whole answer, frozen snapshot, for comparison: columns / rows`,
        `${frozen.columns.ms.toFixed(0)} ms (${kB(frozen.columns.bytes)}) / ${frozen.rows.ms.toFixed(0)} ms (${kB(frozen.rows.bytes)})`,
        "—",
      ],
      [
        `whole answer, live draft, for comparison: columns / rows`,
        `${live.columns.ms.toFixed(0)} ms (${kB(live.columns.bytes)}) / ${live.rows.ms.toFixed(0)} ms (${kB(live.rows.bytes)})`,
        "—",
      ],
      [
        `\`GET /api/v1/health\` while a heavy evaluation runs (${stall.health.length} sequential)`,
        `${spread(stall.health)}: ${verdict(Math.max(...stall.health) < 1000)}`,
        "< 1 s",
      ],
      [
        `small \`POST /api/v1/evaluate\` (20 points) while a heavy evaluation runs (${stall.small.length} sequential)`,
        `${spread(stall.small)}: ${verdict(Math.max(...stall.small) < 1000)}`,
        "< 1 s",
      ],
      [
        `the heavy evaluation itself (${stall.heavyLabel})`,
        `answered ${stall.heavyStatus} after ${(stall.heavyMs / 1000).toFixed(1)} s${stall.allBefore ? "" : " (some small requests came after it)"}`,
        "—",
      ],
      [
        "first-load JavaScript of the case page (gzip, from the build manifests)",
        `${(js.gzipBytes / 1024).toFixed(1)} kB in ${js.files} files: ${verdict(js.gzipBytes <= 250 * 1024)}`,
        "≤ 250 kB",
      ],
    ];
    console.log(
      `\nHeatpath API benchmark — ${new Date().toISOString().slice(0, 16)}Z, ${os.cpus().length} cores, Node ${process.versions.node}, load average ${loadAtStart.toFixed(1)} at the start and ${endLoad.toFixed(1)} at the end; next start on 127.0.0.1, autocannon ${CONNECTIONS} connections, ${SECONDS} s per target\n`,
    );
    console.log("| measurement | figure | target |\n|---|---|---|");
    for (const [m, f, t] of rows) console.log(`| ${m} | ${f} | ${t} |`);

    console.log(
      `\nserver CPU per request at ${CONNECTIONS} connections, all threads (main thread): health ${cpu(health)}, me ${cpu(me)}, evaluate rows ${cpu(evaluate)}, columns ${cpu(columns)}`,
    );
    console.log(
      `one request at a time (median of 29): health ${single.health.ms.toFixed(1)} ms, evaluate rows ${single.rows.ms.toFixed(1)} ms, columns ${single.columns.ms.toFixed(1)} ms`,
    );
    console.log(
      `the live draft's request through POST /api/v1/evaluate?format=columns (${bigPoints} points, the engine's share): median ${bigEvaluate.ms.toFixed(0)} ms (${kB(bigEvaluate.bytes)})`,
    );
    if (ratio < 0.5 && columns.cpuMs !== null && health.cpuMs !== null) {
      console.log(
        `evaluate (columns) missed: the server spent ${(columns.cpuMs / health.cpuMs).toFixed(1)} × health's CPU per request (${columns.cpuMs.toFixed(2)} against ${health.cpuMs.toFixed(2)} ms), ` +
          `${(columns.cpuMs - columns.mainMs!).toFixed(2)} ms of it in the engine's worker threads, and autocannon shares the same ${os.cpus().length} cores` +
          (endLoad > os.cpus().length ? `; the machine was loaded (load average ${endLoad.toFixed(1)} on ${os.cpus().length} cores), so re-run on a quiet one` : ""),
      );
    }
    for (const [name, t] of [
      ["frozen snapshot", frozen.page],
      ["live draft", live.page],
    ] as const) {
      if (!pageMet(t)) {
        console.log(
          `case results request (${name}) missed: p50 ${t.ms.toFixed(0)} ms, p99 ${t.p99.toFixed(0)} ms` +
            (name === "live draft"
              ? `; the engine's answer for the same request alone takes ${bigEvaluate.ms.toFixed(0)} ms`
              : `; the first request, which reads the snapshot from the database, took ${t.first.toFixed(0)} ms`) +
            (endLoad > os.cpus().length ? `; load average ${endLoad.toFixed(1)} on ${os.cpus().length} cores` : ""),
        );
      }
    }
  } finally {
    server.kill("SIGKILL");
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * One member's heavy evaluation (an expression Cp of 40 terms on 10 000 temperatures, synthetic; within the engine's budgets)
 * and, while it runs, health and small evaluations one after another, each timed.
 */
async function duringHeavy(base: string, cookie: string) {
  const post = (body: unknown) => fetch(`${base}/api/v1/evaluate`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(body) });
  await (await post(smallRequest())).arrayBuffer();
  const started = performance.now();
  let heavyMs = 0;
  let running = true;
  const heavy = post(heavyRequest()).then(async (r) => {
    await r.arrayBuffer();
    heavyMs = performance.now() - started;
    running = false;
    return r.status;
  });
  await new Promise((r) => setTimeout(r, 300));
  const health: number[] = [];
  const small: number[] = [];
  let allBefore = true;
  for (let i = 0; i < 10 && running; i++) {
    let t = performance.now();
    await (await fetch(`${base}/api/v1/health`)).arrayBuffer();
    health.push(performance.now() - t);
    t = performance.now();
    const r = await post(smallRequest());
    await r.arrayBuffer();
    if (r.status !== 200) throw new Error(`small evaluate answered ${r.status}`);
    small.push(performance.now() - t);
    allBefore &&= running;
  }
  const heavyStatus = await heavy;
  return { health, small, heavyMs, heavyStatus, allBefore, heavyLabel: "expression Cp of 40 terms, 10 000 temperatures" };
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : String(e));
  process.exit(1);
});
