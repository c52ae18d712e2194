/** Helpers shared by the component tests: a fresh react-query client per test and a routed fake fetch. */
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { render } from "@testing-library/react";
import type { ReactElement } from "react";
import { vi } from "vitest";

/** Renders inside its own QueryClientProvider; no retries, so a refusal shows at once. */
export function renderWithQuery(ui: ReactElement) {
  const client = new QueryClient({
    defaultOptions: { queries: { retry: false, gcTime: Infinity }, mutations: { retry: false } },
  });
  return { client, ...render(<QueryClientProvider client={client}>{ui}</QueryClientProvider>) };
}

export type FetchCall = { url: string; method: string; body: unknown };
type Handler = (
  call: FetchCall,
) => { status?: number; json: unknown } | Promise<{ status?: number; json: unknown }>;

/**
 * Replaces the global fetch for one test. Each request goes to the first route whose method and
 * url match; every call is kept, with its JSON body parsed, for the test to read.
 */
export function fakeFetch(routes: Array<{ method?: string; url: string | RegExp; reply: Handler }>) {
  const calls: FetchCall[] = [];
  const mock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === "string" ? input : input instanceof URL ? input.href : input.url;
    const method = (init?.method ?? "GET").toUpperCase();
    const body = typeof init?.body === "string" ? (JSON.parse(init.body) as unknown) : undefined;
    const call = { url, method, body };
    calls.push(call);
    const route = routes.find(
      (r) => (r.method ?? "GET") === method && (typeof r.url === "string" ? r.url === url : r.url.test(url)),
    );
    if (!route)
      return new Response(JSON.stringify({ error: `No fake for ${method} ${url}` }), { status: 599 });
    const { status = 200, json } = await route.reply(call);
    return new Response(JSON.stringify(json), { status, headers: { "content-type": "application/json" } });
  });
  vi.stubGlobal("fetch", mock);
  return { calls, mock, sent: (method: string) => calls.filter((c) => c.method === method) };
}

/** Markup a client might type into a note; it must arrive on screen as these very characters. */
export const TYPED_MARKUP = `<img src="x" onerror="alert(1)"><b>bold</b><script>alert(2)</script>`;
