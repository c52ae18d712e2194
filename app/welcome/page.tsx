import Link from "next/link";
import { redirect } from "next/navigation";
import { homePathFor, requireActorPage } from "@/app/_server/access";
import { Logo } from "@/components/ui/Logo";

export const dynamic = "force-dynamic";

export default async function WelcomePage() {
  const actor = await requireActorPage("/welcome");
  if (actor.memberships.length || actor.contacts.length) redirect(homePathFor(actor));
  return (
    <main className="mx-auto max-w-lg px-gutter py-16">
      <Logo />
      <div className="card mt-8 p-6">
        <h1 className="text-2xl">You are signed in, but not on a team yet</h1>
        <p className="mt-2 text-ink-700">Ask a shop owner to invite {actor.email}, or start a shop of your own.</p>
        <Link href="/sign-up" className="btn-primary mt-6">
          Start a shop
        </Link>
      </div>
    </main>
  );
}
