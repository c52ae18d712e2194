import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getActor, homePathFor } from "@/app/_server/access";
import { localPath, shownEmail } from "@/lib/sign-in-paths";
import { SignInForm } from "./SignInForm";

export const metadata: Metadata = { title: "Sign in" };

const ERRORS: Record<string, string> = {
  NoAccount: "There is no Chalkline account for that e-mail. Ask your shop for an invitation, or start a shop.",
  Verification: "That sign-in link has expired or was already used. Ask for a new one below.",
  EmailSignin: "We could not send the sign-in e-mail. Try again in a moment.",
  CredentialsSignin: "That e-mail and password do not match.",
  EmailUnproven: "Open the link we e-mailed to your address first: it proves the address is yours. Then your password works.",
  SessionRequired: "Sign in to continue.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const params = await searchParams;
  const actor = await getActor().catch(() => null);
  const callbackUrl = localPath(params.callbackUrl);
  if (actor) redirect(callbackUrl ?? homePathFor(actor));
  const error = params.error ? (ERRORS[params.error] ?? "Sign-in did not work. Try again.") : undefined;
  return <SignInForm callbackUrl={callbackUrl} initialError={error} initialEmail={shownEmail(params.email)} signedOut={params.signedOut === "1"} />;
}
