"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { z } from "zod";

// The page's CSP has no 'unsafe-eval': zod must not try to compile validators with new Function.
z.config({ jitless: true });

/**
 * What every page shares on the client: the query cache. No session provider: no page reads the
 * session in the browser (pages get it on the server, and signIn/signOut call the auth routes
 * themselves), so every page is spared its code and its /api/auth/session request.
 */
export function Providers({ children }: { children: ReactNode }) {
  const [queryClient] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 10_000, refetchOnWindowFocus: true, retry: 2 } } }),
  );
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
