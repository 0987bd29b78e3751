import { env } from "@/lib/env";
import { startMailCatcher } from "@/lib/mail-catcher";

/** Start the local mail catcher for a test file; the returned function stops it. */
export async function startTestMailCatcher(): Promise<() => Promise<void>> {
  const catcher = await startMailCatcher(env.MAIL_CATCHER_PORT);
  return () => new Promise<void>((r) => catcher.close(() => r()));
}
