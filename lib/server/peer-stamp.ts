import diagnostics from "node:diagnostics_channel";
import type { IncomingMessage } from "node:http";
import type { Socket } from "node:net";

/** The header the server stamps with the address that connected, overwriting any a client sent. */
export const PEER_HEADER = "x-loamwork-peer";

/**
 * Writes the address each request connected from into PEER_HEADER before Next reads the request, replacing
 * any such header a client sent. Next's route handlers see headers only, and the X-Forwarded-For that Next
 * adds keeps a value the client sent itself, so without this no handler could know who connected.
 * Node publishes every incoming request on this channel before the server's request event.
 */
export function stampPeerAddresses(): void {
  const g = globalThis as { __loamworkPeerStamping?: boolean };
  if (g.__loamworkPeerStamping) return;
  diagnostics.subscribe("http.server.request.start", (message) => {
    const { request, socket } = message as { request: IncomingMessage; socket: Socket };
    request.headers[PEER_HEADER] = socket.remoteAddress ?? "unknown";
  });
  g.__loamworkPeerStamping = true;
}
