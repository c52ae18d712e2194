import { timingSafeEqual } from "node:crypto";
import { notFound } from "next/navigation";
import { mailFake } from "@/app/_server/config";
import { Logo } from "@/components/ui/Logo";
import { MailboxView, type CaughtMessage } from "./MailboxView";

export const dynamic = "force-dynamic";
export const metadata = { title: "Dev mailbox" };

function sameKey(given: string, key: string): boolean {
  const a = Buffer.from(given);
  const b = Buffer.from(key);
  return a.length === b.length && timingSafeEqual(a, b);
}

/**
 * Lists what the local mail catcher received. Exists only while the catcher is in use, and only
 * for whoever holds this install's key (`npm start` prints the full address).
 */
export default async function MailboxPage({ searchParams }: { searchParams: Promise<{ key?: string | string[] }> }) {
  const fake = mailFake();
  const { key } = await searchParams;
  if (!fake || typeof key !== "string" || !sameKey(key, fake.key)) notFound();
  let messages: CaughtMessage[] = [];
  let error: string | undefined;
  try {
    const response = await fetch(`${fake.api}/messages`, { cache: "no-store", headers: { "x-fake-key": fake.key } });
    messages = (await response.json()) as CaughtMessage[];
  } catch {
    error = "The local mail catcher is not answering. Restart with `npm start`.";
  }
  return (
    <main className="mx-auto max-w-5xl px-gutter py-8">
      <div className="mb-6 flex items-center justify-between">
        <Logo />
        <span className="rounded-full bg-ochre-100 px-3 py-1 text-xs font-medium text-ochre-800">Development only</span>
      </div>
      <h1 className="text-2xl">Dev mailbox</h1>
      <p className="mt-1 text-ink-600">Every e-mail the app sent while running with the local mail catcher.</p>
      {error ? <p className="mt-4 rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800">{error}</p> : null}
      <MailboxView messages={messages} />
    </main>
  );
}
