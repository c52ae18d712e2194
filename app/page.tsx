import Link from "next/link";
import { redirect } from "next/navigation";
import { getActor, homePathFor } from "@/app/_server/access";
import { Logo } from "@/components/ui/Logo";

export const dynamic = "force-dynamic";

export default async function LandingPage() {
  const actor = await getActor().catch(() => null);
  if (actor) redirect(homePathFor(actor));
  return (
    <div className="min-h-screen">
      <header className="mx-auto flex max-w-5xl items-center justify-between px-gutter py-5">
        <Logo />
        <Link href="/sign-in" className="btn-quiet">
          Sign in
        </Link>
      </header>
      <main className="mx-auto max-w-5xl px-gutter pb-20 pt-10 sm:pt-20">
        <p className="text-sm font-medium uppercase tracking-wider text-patina-700">For apparel decorators</p>
        <h1 className="mt-3 max-w-3xl text-3xl leading-tight sm:text-[2.6rem] sm:leading-[1.15]">
          Put the print where it belongs, at the size it really is.
        </h1>
        <p className="mt-5 max-w-2xl text-lg text-ink-700">
          Chalkline draws each blank at true scale, so you place art in real inches on an adult tee, a youth tee or a 3XL
          hoodie. Send the mock-up, collect the approval and the deposit, and hand the press a spec it can trust.
        </p>
        <div className="mt-8 flex flex-wrap gap-3">
          <Link href="/sign-up" className="btn-primary px-5 py-2.5 text-base">
            Start a shop
          </Link>
          <Link href="/sign-in" className="btn-quiet px-5 py-2.5 text-base">
            I have an account
          </Link>
        </div>
        <ul className="mt-16 grid gap-4 sm:grid-cols-3">
          {[
            ["True size", "Garments drawn from their size charts. An inch on screen is an inch once you calibrate."],
            ["Client proofs", "A link your client opens on a phone: pin a note, approve a revision, pay the deposit."],
            ["Press-ready", "Per-size specs, tiled paper test prints and packed transfer sheets."],
          ].map(([title, body]) => (
            <li key={title} className="card p-5">
              <h2 className="text-lg">{title}</h2>
              <p className="mt-1 text-sm text-ink-600">{body}</p>
            </li>
          ))}
        </ul>
      </main>
    </div>
  );
}
