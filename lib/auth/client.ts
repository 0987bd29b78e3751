/**
 * The caller's address as the app server saw it. `next start` appends the
 * socket address to x-forwarded-for, so the last entry is the one this server
 * can vouch for; earlier entries are whatever the client claimed.
 */
export function clientAddress(headers: Headers): string | null {
  const forwarded = headers.get("x-forwarded-for");
  if (forwarded) {
    const last = forwarded.split(",").map((s) => s.trim()).filter(Boolean).pop();
    if (last) return last.slice(0, 64);
  }
  return headers.get("x-real-ip")?.slice(0, 64) ?? null;
}
