import Link from "next/link";
import { findInvitation } from "@/db/queries/shops";
import { findUserByEmail } from "@/db/queries/users";
import { Logo } from "@/components/ui/Logo";
import { ROLE_LABELS } from "@/lib/access";
import { AcceptInvite } from "./AcceptInvite";

export const dynamic = "force-dynamic";
export const metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invite = await findInvitation({ token });
  const usable = invite && !invite.acceptedAt && invite.expiresAt > new Date();
  const existing = usable ? await findUserByEmail({ email: invite.email }) : undefined;
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
            <AcceptInvite token={token} email={invite.email} needsAccount={!existing} />
          </>
        )}
      </div>
    </main>
  );
}
