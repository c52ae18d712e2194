/** Small shared pieces for the local fakes' HTTP servers: loopback only, tracked sockets, clear port errors. */
import type { Server } from "node:http";
import type { AddressInfo, Socket } from "node:net";

export const LOOPBACK = "127.0.0.1";

export function listenError(what: string, port: number, err: NodeJS.ErrnoException): Error {
  if (err.code === "EADDRINUSE") {
    return new Error(`Port ${port} on ${LOOPBACK} is already in use. Is another ${what} running? Stop it or choose another port.`, { cause: err });
  }
  if (err.code === "EACCES") return new Error(`Not allowed to listen on ${LOOPBACK}:${port}; pick a port above 1024.`, { cause: err });
  return new Error(`Could not listen on ${LOOPBACK}:${port}: ${err.message}`, { cause: err });
}

/** Keeps every open socket in `sockets` (so close() can end them) and answers malformed requests with a 400. */
export function trackSockets(server: Server, sockets: Set<Socket>): void {
  server.on("connection", (socket) => {
    sockets.add(socket);
    socket.on("close", () => sockets.delete(socket));
  });
  server.on("clientError", (_err, socket) => {
    if (socket.writable) socket.end("HTTP/1.1 400 Bad Request\r\nConnection: close\r\n\r\n");
    else socket.destroy();
  });
}

/** Listens on 127.0.0.1 only and resolves with the port actually bound (0 picks a free one). */
export async function listenOnLoopback(server: Server, port: number, what: string, log: (line: string) => void): Promise<number> {
  await new Promise<void>((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => reject(listenError(what, port, err));
    server.once("error", onError);
    server.listen(port, LOOPBACK, () => {
      server.off("error", onError);
      server.on("error", (err) => log(`server error: ${err.message}`));
      resolve();
    });
  });
  return (server.address() as AddressInfo).port;
}

/** For a fake run from the command line: close it on Ctrl-C or SIGTERM, then exit. */
export function closeOnSignals(name: string, close: () => Promise<void>, log: (line: string) => void): void {
  const stop = (signal: NodeJS.Signals) => {
    log(`${signal}: shutting down`);
    close().then(
      () => process.exit(0),
      (err: unknown) => {
        process.stderr.write(`${name}: error while closing: ${err instanceof Error ? err.message : String(err)}\n`);
        process.exit(1);
      },
    );
  };
  process.once("SIGINT", stop);
  process.once("SIGTERM", stop);
}
