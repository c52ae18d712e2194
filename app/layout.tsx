import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import type { ReactNode } from "react";
import { mono, sans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Chalkline", template: "%s · Chalkline" },
  description: "True-scale size and placement proofs for apparel decorators and their clients.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#f6f3ec" };

export default async function RootLayout({ children }: { children: ReactNode }) {
  // Every page renders per request, so Next.js can put this request's CSP nonce on its scripts (see proxy.ts).
  await connection();
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body>
        {children}
      </body>
    </html>
  );
}
