import Link from "next/link";
import { getActor } from "@/app/_server/access";
import { findInvitation } from "@/db/queries/shops";
import { findUserByEmail } from "@/db/queries/users";
import { Logo } from "@/components/ui/Logo";
import { ROLE_LABELS } from "@/lib/access";
import { AcceptInvite, SwitchAccount } from "./AcceptInvite";

export const dynamic = "force-dynamic";
export const metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invite = await findInvitation({ token });
  const usable = invite && !invite.acceptedAt && invite.expiresAt > new Date();
  const existing = usable ? await findUserByEmail({ email: invite.email }) : undefined;
  const actor = existing ? await getActor().catch(() => null) : null;
  const back = `/invite/${encodeURIComponent(token)}`;
  const signInHref = invite ? `/sign-in?${new URLSearchParams({ callbackUrl: back, email: invite.email })}` : "/sign-in";
  return (
    <main className="mx-auto max-w-md px-gutter py-12">
      <Logo />
      <div className="card mt-8 p-6">
        {!usable ? (
          <>
            <h1 className="text-2xl">This invitation cannot be used</h1>
            <p className="mt-2 text-ink-700">It may have expired or been used already. Ask the shop owner to send a new one.</p>
            <Link href="/sign-in" className="btn-quiet mt-6">
              Go to sign in
            </Link>
          </>
        ) : (
          <>
            <h1 className="text-2xl">Join {invite.shopName}</h1>
            <p className="mt-2 text-ink-700">
              You are invited as <strong>{ROLE_LABELS[invite.role].toLowerCase()}</strong> with {invite.email}.
            </p>
            {!existing ? (
              <AcceptInvite token={token} email={invite.email} needsAccount />
            ) : actor?.id === existing.id ? (
              <AcceptInvite token={token} email={invite.email} needsAccount={false} />
            ) : actor ? (
              // Signed in as someone else: the invitation joins the account of its own address only.
              <SwitchAccount signedInAs={actor.email} email={invite.email} signInHref={signInHref} />
            ) : (
              <div className="mt-6 space-y-4" data-testid="invite-sign-in-first">
                <p className="text-sm text-ink-700">
                  There is already a Chalkline account for {invite.email}. Sign in to it first; you come back here to accept.
                </p>
                <Link href={signInHref} className="btn-primary w-full">
                  Sign in as {invite.email}
                </Link>
              </div>
            )}
          </>
        )}
      </div>
    </main>
  );
}
