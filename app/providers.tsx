"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";

/**
 * The query cache, for the pages that fetch from the browser: the shop's pages, the client's
 * portal and the review link. The root layout has no provider: a page that never queries (signing
 * in or up, the landing page) loads none of this. No session provider either: no page reads the
 * session in the browser (pages get it on the server, and signIn/signOut call the auth routes).
 */
export function QueryProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 10_000, refetchOnWindowFocus: true, retry: 2 } } }),
  );
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
