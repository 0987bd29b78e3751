import crypto from "node:crypto";
import http from "node:http";

/**
 * The TCP peer's address, as the HTTP server's socket saw it. Next's route handlers and
 * server actions get no socket, and `next start` only fills x-forwarded-for with the socket
 * address when the client sent none (`??=` in next/dist/server/base-server.js), so a client's
 * own x-forwarded-for reaches the app unchanged. instrumentation.ts therefore installs this
 * hook in the app server: every incoming request gets a header carrying the socket address,
 * tagged with a random token of this process, so a client cannot supply one of its own (a
 * header without the right token is ignored).
 */
export const PEER_HEADER = "x-heatpath-peer";

type Holder = { __heatpathPeerToken?: string; __heatpathPeerHook?: boolean };
const holder = globalThis as Holder;

function token(): string {
  holder.__heatpathPeerToken ??= crypto.randomBytes(16).toString("hex");
  return holder.__heatpathPeerToken;
}

/** The header value for a socket address (the hook; tests that call handlers directly). */
export function peerHeaderValue(address: string): string {
  return `${token()} ${address}`;
}

/** The socket address from the hook's header, or null when there is none with this process's token. */
export function peerAddress(headers: Headers): string | null {
  const value = headers.get(PEER_HEADER);
  if (!value || !holder.__heatpathPeerToken) return null;
  const [t, address] = value.split(" ");
  return t === holder.__heatpathPeerToken && address ? address : null;
}

/** Patch http.Server so every request carries its socket address (replacing any header of that name). */
export function installPeerAddressHook(): void {
  if (holder.__heatpathPeerHook) return;
  holder.__heatpathPeerHook = true;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === "request") {
      const req = args[0] as http.IncomingMessage;
      req.headers[PEER_HEADER] = peerHeaderValue(req.socket?.remoteAddress ?? "");
    }
    return emit.apply(this, [event, ...args] as Parameters<typeof emit>);
  } as typeof emit;
}
