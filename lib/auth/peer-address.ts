// Stamps the socket's peer address on every request the Node.js server receives, so route handlers
// (which see only headers) know who is really connected. Loaded once by instrumentation.ts.
import http from "node:http";
import { PEER_ADDRESS_HEADER } from "./client-address";

const marker = Symbol.for("benchwarden.peerAddressStamped");

export function stampPeerAddresses(): void {
  const proto = http.Server.prototype as http.Server & { [marker]?: boolean };
  if (proto[marker]) return;
  proto[marker] = true;
  const emit = proto.emit;
  proto.emit = function stampedEmit(this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === "request") {
      const request = args[0] as http.IncomingMessage;
      // Overwrites any header of that name a client sent: only the socket decides.
      request.headers[PEER_ADDRESS_HEADER] = request.socket?.remoteAddress ?? "";
    }
    return (emit as (this: http.Server, ...a: unknown[]) => boolean).apply(this, [event, ...args]);
  } as typeof proto.emit;
}
