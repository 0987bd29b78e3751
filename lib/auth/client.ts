import { env, isIpAddress } from "@/lib/env";
import { peerAddress } from "./peer-address";

/**
 * The caller's address, for the sign-in limits. Without TRUST_PROXY it is the socket address
 * (lib/auth/peer-address.ts) and x-forwarded-for is ignored: any client can write that header.
 * Behind proxies, TRUST_PROXY says whom to believe, walking x-forwarded-for from the right
 * (the socket address appended last):
 * - a number N: the N nearest hops are proxies; the address N places left of the socket is the client;
 * - a list of addresses: entries that are one of those proxies are skipped; the first other one is the client.
 * null when the address cannot be known (no socket address: a handler called outside the app server).
 */
export function clientAddress(headers: Headers, trustProxy: string = env.TRUST_PROXY): string | null {
  const socket = peerAddress(headers);
  if (!socket) return null;
  const trust = parseTrustProxy(trustProxy);
  if (trust === null) return normalise(socket);
  const chain = [
    ...(headers.get("x-forwarded-for") ?? "")
      .split(",")
      .map((s) => s.trim())
      .filter(Boolean),
    socket,
  ].map(normalise);
  if (typeof trust === "number") return chain[Math.max(0, chain.length - 1 - trust)];
  for (let i = chain.length - 1; i >= 0; i--) if (!trust.has(chain[i])) return chain[i];
  return chain[0];
}

export function parseTrustProxy(value: string): number | Set<string> | null {
  const v = value.trim();
  if (v === "" || v === "0") return null;
  if (/^\d+$/.test(v)) return Number(v);
  return new Set(v.split(",").map((a) => normalise(a.trim())));
}

/** One spelling per address (IPv4-mapped IPv6 as IPv4), at most 64 characters; a non-address stays as given, truncated. */
function normalise(address: string): string {
  const a = address.replace(/^\[|\]$/g, "");
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(a);
  if (mapped) return mapped[1];
  return (isIpAddress(a) ? a.toLowerCase() : a).slice(0, 64);
}
