import Link from "next/link";
import { Logo } from "@/components/ui/Logo";

export default function Forbidden() {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-gutter">
      <Logo />
      <p className="measure mt-10 text-sm text-ink-500">403</p>
      <h1 className="mt-1 text-2xl">This page is not open to you</h1>
      <p className="mt-2 text-ink-700">
        You are signed in, but your role does not include this part of Chalkline. If you think it should, ask the shop owner.
      </p>
      <div className="mt-6 flex gap-3">
        <Link href="/home" className="btn-primary">
          Go to my start page
        </Link>
      </div>
    </main>
  );
}
