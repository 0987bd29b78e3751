/** The polling loop behind the mail and impact workers (lib/polling-worker.ts). */
import { afterEach, describe, expect, it, vi } from "vitest";
import { pollingWorker, startPollingWorker } from "@/lib/polling-worker";

const started: string[] = [];
const start = (name: string, run: () => Promise<unknown>, intervalMs = 60_000) => {
  started.push(name);
  return startPollingWorker(name, run, intervalMs);
};
afterEach(() => {
  for (const name of started.splice(0)) pollingWorker(name)?.stop();
  vi.useRealTimers();
  vi.restoreAllMocks();
});

/** A run that waits until released, counting its calls. */
function gatedRun() {
  let calls = 0;
  let release: () => void = () => {};
  const run = vi.fn(async () => {
    calls++;
    await new Promise<void>((r) => (release = r));
  });
  return { run, calls: () => calls, release: () => release() };
}

const settle = () => new Promise((r) => setTimeout(r, 0));

describe("startPollingWorker", () => {
  it("runs on a kick, and a kick during a run makes exactly one more run", async () => {
    const g = gatedRun();
    const w = start("test-kick", g.run);
    w.kick();
    await settle();
    expect(g.calls()).toBe(1);
    w.kick();
    w.kick();
    await settle();
    expect(g.calls()).toBe(1);
    g.release();
    await settle();
    expect(g.calls()).toBe(2);
    g.release();
    await settle();
    expect(g.calls()).toBe(2);
  });

  it("runs every interval until stopped", async () => {
    vi.useFakeTimers();
    const run = vi.fn(async () => {});
    const w = start("test-interval", run, 1000);
    await vi.advanceTimersByTimeAsync(3000);
    expect(run).toHaveBeenCalledTimes(3);
    w.stop();
    await vi.advanceTimersByTimeAsync(3000);
    expect(run).toHaveBeenCalledTimes(3);
    expect(pollingWorker("test-interval")).toBeUndefined();
  });

  it("starts once per name: a second start returns the running worker", () => {
    const a = start("test-once", async () => {});
    const b = start("test-once", async () => {});
    expect(b).toBe(a);
    expect(pollingWorker("test-once")).toBe(a);
  });

  it("a failed run is logged with the worker's name and the next kick runs again", async () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    let n = 0;
    const w = start("test-fail", async () => {
      if (++n === 1) throw new Error("database is locked");
    });
    w.kick();
    await settle();
    expect(warn).toHaveBeenCalledWith("[heatpath] test-fail worker: database is locked");
    w.kick();
    await settle();
    expect(n).toBe(2);
  });
});
