"use client";

import "@/components/forms/zod-jitless";
import Link from "next/link";
import { useState, type ReactNode } from "react";
import type { NavItem } from "@/lib/access";
import { Logo } from "../ui/Logo";
import { AccountMenu } from "./AccountMenu";
import { NavLinks } from "./NavLinks";

type Props = {
  homeHref: string;
  contextLabel: string;
  nav: NavItem[];
  user: { name: string | null; email: string };
  roleLabel: string;
  children: ReactNode;
};

export function AppShell({ homeHref, contextLabel, nav, user, roleLabel, children }: Props) {
  const [drawer, setDrawer] = useState(false);
  const rail = (
    <div className="flex h-full flex-col gap-6 p-4">
      <div>
        <Link href={homeHref} className="block px-2" onClick={() => setDrawer(false)}>
          <Logo />
        </Link>
        <p className="mt-3 truncate px-2 text-xs font-medium uppercase tracking-wider text-ink-500">{contextLabel}</p>
      </div>
      <nav aria-label="Main" className="flex-1">
        <NavLinks items={nav} onNavigate={() => setDrawer(false)} />
      </nav>
      <AccountMenu name={user.name} email={user.email} roleLabel={roleLabel} />
    </div>
  );

  return (
    <div className="min-h-screen lg:flex">
      <aside className="hidden w-rail shrink-0 border-r border-paper-300 bg-paper-100 lg:block">
        <div className="sticky top-0 h-screen">{rail}</div>
      </aside>
      <header className="sticky top-0 z-20 flex h-bar items-center justify-between border-b border-paper-300 bg-paper-100 px-4 lg:hidden">
        <Link href={homeHref}>
          <Logo />
        </Link>
        <button
          type="button"
          className="btn-quiet px-3"
          aria-expanded={drawer}
          aria-controls="mobile-drawer"
          onClick={() => setDrawer((v) => !v)}
        >
          Menu
        </button>
      </header>
      {drawer ? (
        <div className="fixed inset-0 z-40 lg:hidden">
          <button type="button" aria-label="Close menu" className="absolute inset-0 bg-ink-900/30" onClick={() => setDrawer(false)} />
          <div id="mobile-drawer" className="absolute inset-y-0 left-0 w-72 max-w-[85vw] bg-paper-100 shadow-lift">
            {rail}
          </div>
        </div>
      ) : null}
      <main className="min-w-0 flex-1 px-gutter py-6 lg:px-10 lg:py-8">{children}</main>
    </div>
  );
}
