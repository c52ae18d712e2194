import "server-only";
import { isIP } from "node:net";
import { headers } from "next/headers";
import { CLIENT_ADDRESS_HEADER } from "@/lib/client-address";

let warned = false;

/**
 * The client's address, as scripts/serve.ts worked it out from the socket (and, behind a proxy in
 * TRUSTED_PROXIES, from X-Forwarded-For). Never the headers a client sends: without that server in
 * this process (a bare `next start`) the header could be anyone's, so there is no address (null).
 */
export function clientAddressFrom(source: Headers): string | null {
  if (process.env.CHALKLINE_CLIENT_ADDRESS !== "stamped") {
    if (!warned) console.warn("[limits] the app was not started through scripts/serve.ts; client addresses are unknown, so per-address limits are shared by everyone");
    warned = true;
    return null;
  }
  const value = source.get(CLIENT_ADDRESS_HEADER);
  return value && isIP(value) ? value : null;
}

/** The address of the request a route handler is answering. */
export function clientAddress(request: Request): string | null {
  return clientAddressFrom(request.headers);
}

/** The address of the request a server action is answering (null when called outside a request). */
export async function actionClientAddress(): Promise<string | null> {
  let source: Headers;
  try {
    source = new Headers(await headers());
  } catch {
    return null;
  }
  return clientAddressFrom(source);
}
