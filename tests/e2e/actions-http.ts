/**
 * Server actions over HTTP, as a browser posts them to the production build: the action id from the
 * build's manifest, the arguments as the browser's encoder writes plain JSON, the session cookie.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { BASE_URL } from "./support";

type ManifestAction = { exportedName?: string; filename?: string; workers: Record<string, unknown> };

/** The build's id for an action, by its file and export name. */
export function actionId(file: string, exportName: string): string {
  const manifest = JSON.parse(readFileSync(path.join(process.cwd(), ".next", "server", "server-reference-manifest.json"), "utf8")) as { node: Record<string, ManifestAction> };
  for (const [id, entry] of Object.entries(manifest.node)) {
    if (entry.exportedName === exportName && entry.filename?.replace(/^\.\//, "") === file) return id;
  }
  throw new Error(`${file}#${exportName} is not in the build's action manifest`);
}

/**
 * Posts one action call to a page path and returns the action's result object, read from the
 * flight response (the line whose JSON carries "ok").
 */
export async function callAction<T = { ok: boolean; [key: string]: unknown }>(opts: { file: string; name: string; pagePath: string; args: unknown[]; cookie?: string; baseUrl?: string }): Promise<{ status: number; result: T | null; text: string }> {
  const base = opts.baseUrl ?? BASE_URL;
  const headers: Record<string, string> = { "next-action": actionId(opts.file, opts.name), "content-type": "text/plain;charset=UTF-8", accept: "text/x-component", origin: base };
  if (opts.cookie) headers.cookie = opts.cookie;
  const response = await fetch(`${base}${opts.pagePath}`, { method: "POST", headers, body: JSON.stringify(opts.args) });
  const text = await response.text();
  let result: T | null = null;
  for (const line of text.split("\n")) {
    const at = line.indexOf(":");
    if (at < 0) continue;
    try {
      const value = JSON.parse(line.slice(at + 1)) as unknown;
      if (value && typeof value === "object" && "ok" in value) result = value as T;
    } catch {
      // Not a JSON row of the flight stream.
    }
  }
  return { status: response.status, result, text };
}
