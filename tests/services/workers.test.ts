/**
 * The mail and impact workers as instrumentation.ts starts them: one polling loop each
 * (lib/polling-worker.ts), woken at once by an enqueue, and started once per process.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { startImpactWorker } from "@/lib/impact-worker";
import { startMailWorker } from "@/lib/mail-worker";
import { pollingWorker } from "@/lib/polling-worker";
import { invite } from "@/lib/services/team";
import { actorOf } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { startTestMailCatcher } from "../helpers/mail";

let stopCatcher: () => Promise<void>;

beforeAll(async () => {
  await freshDatabase();
  stopCatcher = await startTestMailCatcher();
});
afterAll(async () => {
  pollingWorker("mail")?.stop();
  pollingWorker("impact")?.stop();
  await stopCatcher();
  await closeDb();
});

/** Polls `check` every 50 ms for at most `ms`. */
async function eventually(check: () => Promise<boolean>, ms = 10_000): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, 50));
  }
  return false;
}

describe("workers", () => {
  it("an enqueued mail is delivered at once, long before the (one-hour) poll", async () => {
    await startMailWorker({ intervalMs: 3_600_000, catcher: false });
    const first = pollingWorker("mail");
    expect(first).toBeDefined();
    await startMailWorker({ intervalMs: 3_600_000, catcher: false });
    expect(pollingWorker("mail")).toBe(first);
    await invite(await actorOf("admin"), { email: "wanda.worker@example.test", role: "engineer" });
    const sent = () =>
      models()
        .MailMessage.count({ where: { kind: "invitation", status: "sent" } })
        .then((n) => n > 0);
    expect(await eventually(sent)).toBe(true);
  });

  it("the impact worker starts once per process", async () => {
    await startImpactWorker({ intervalMs: 3_600_000 });
    const first = pollingWorker("impact");
    expect(first).toBeDefined();
    await startImpactWorker({ intervalMs: 3_600_000 });
    expect(pollingWorker("impact")).toBe(first);
  });
});
