import Link from "next/link";
import { Logo } from "@/components/ui/Logo";

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-gutter">
      <Logo />
      <p className="measure mt-10 text-sm text-ink-500">404</p>
      <h1 className="mt-1 text-2xl">Nothing here</h1>
      <p className="mt-2 text-ink-700">The page does not exist, or it belongs to someone else.</p>
      <Link href="/home" className="btn-quiet mt-6 self-start">
        Go to my start page
      </Link>
    </main>
  );
}
