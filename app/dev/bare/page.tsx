import { notFound } from "next/navigation";
import { mailFake } from "@/app/_server/config";

export const metadata = { title: "Bare page", robots: { index: false } };

/**
 * A page with nothing of ours on it: `npm run bench` weighs its first-load JavaScript as the
 * framework's floor (the root layout, Next.js and React) beside the app's smallest pages. Like
 * the dev mailbox, it answers only while the local fakes are in use.
 */
export default function BarePage() {
  if (!mailFake()) notFound();
  return <p className="p-gutter text-sm text-ink-600">This page holds no script of its own.</p>;
}
