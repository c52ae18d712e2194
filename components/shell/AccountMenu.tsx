"use client";

import { signOut } from "@/components/forms/auth-client";
import { useEffect, useRef, useState } from "react";

export function AccountMenu({ name, email, roleLabel }: { name: string | null; email: string; roleLabel: string }) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const close = (event: MouseEvent) => {
      if (ref.current && !ref.current.contains(event.target as Node)) setOpen(false);
    };
    const escape = (event: KeyboardEvent) => event.key === "Escape" && setOpen(false);
    document.addEventListener("mousedown", close);
    document.addEventListener("keydown", escape);
    return () => {
      document.removeEventListener("mousedown", close);
      document.removeEventListener("keydown", escape);
    };
  }, [open]);

  const initials = (name ?? email)
    .split(/[\s@.]+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((part) => part[0]!.toUpperCase())
    .join("");

  return (
    <div ref={ref} className="relative">
      <button
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((v) => !v)}
        className="flex w-full items-center gap-3 rounded-lg px-2 py-2 text-left hover:bg-paper-200"
      >
        <span className="grid h-8 w-8 place-items-center rounded-full bg-ink-800 text-xs font-semibold text-chalk">{initials}</span>
        <span className="min-w-0 flex-1">
          <span className="block truncate text-sm font-medium text-ink-900">{name ?? email}</span>
          <span className="block truncate text-xs text-ink-500">{roleLabel}</span>
        </span>
      </button>
      {open ? (
        <div role="menu" className="absolute bottom-full left-0 right-0 z-30 mb-2 rounded-card border border-paper-300 bg-chalk p-1 shadow-lift">
          <p className="truncate px-3 py-2 text-xs text-ink-500">{email}</p>
          <button
            type="button"
            role="menuitem"
            onClick={() => signOut({ callbackUrl: "/sign-in?signedOut=1" })}
            className="block w-full rounded-md px-3 py-2 text-left text-sm text-ink-800 hover:bg-paper-200"
          >
            Sign out
          </button>
        </div>
      ) : null}
    </div>
  );
}
