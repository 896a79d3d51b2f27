import "server-only";
import { env } from "@/lib/env";
import { PEER_HEADER } from "./peer-stamp";

const stamping = () => (globalThis as { __loamworkPeerStamping?: boolean }).__loamworkPeerStamping === true;

/**
 * The client's address, for limits. Next passes on whatever X-Forwarded-For a client sends, so the header is
 * believed only as far as LOAMWORK_TRUSTED_PROXIES says: with N proxies, the address the N-th proxy from
 * the server saw. With none, it is the address that connected to the server. When the server did not stamp
 * that address (no instrumentation), every caller shares one address, so limits stay tight, never open.
 */
export function clientAddress(headers: Headers, trustedProxies = env().LOAMWORK_TRUSTED_PROXIES): string {
  const peer = stamping() ? headers.get(PEER_HEADER)?.trim() || "unknown" : "unknown";
  if (trustedProxies === 0) return peer;
  const forwarded = (headers.get("x-forwarded-for") ?? "")
    .split(",")
    .map((a) => a.trim())
    .filter(Boolean);
  const chain = [...forwarded, peer];
  return chain[Math.max(0, chain.length - 1 - trustedProxies)] ?? peer;
}
