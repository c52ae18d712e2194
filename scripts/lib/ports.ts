/** Waiting for a loopback port to accept connections. */
import type { ChildProcess } from "node:child_process";
import net from "node:net";
import { sleep } from "./proc";

export function portOpen(port: number, host = "127.0.0.1"): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    socket.once("connect", () => {
      socket.destroy();
      resolve(true);
    });
    socket.once("error", () => resolve(false));
  });
}

/** Resolves once 127.0.0.1:port accepts a connection; fails when `child` exits first or after `timeoutMs`. */
export async function waitForPort(port: number, timeoutMs: number, child?: ChildProcess): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && (child.exitCode !== null || child.signalCode !== null)) throw new Error(`the process for port ${port} exited (${child.exitCode ?? child.signalCode}) before it listened`);
    if (await portOpen(port)) return;
    await sleep(100);
  }
  throw new Error(`nothing listened on 127.0.0.1:${port} within ${Math.round(timeoutMs / 1000)} s`);
}
