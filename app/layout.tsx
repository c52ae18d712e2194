import type { Metadata, Viewport } from "next";
import type { ReactNode } from "react";
import { mono, sans } from "./fonts";
import { Providers } from "./providers";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Chalkline", template: "%s · Chalkline" },
  description: "True-scale size and placement proofs for apparel decorators and their clients.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#f6f3ec" };

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body>
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
