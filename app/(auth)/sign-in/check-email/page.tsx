import Link from "next/link";
import { localPath, shownEmail } from "@/lib/sign-in-paths";
import { SendAgain } from "./SendAgain";

export const metadata = { title: "Check your e-mail" };

export default async function CheckEmailPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const params = await searchParams;
  const email = shownEmail(params.email);
  const callbackUrl = localPath(params.callbackUrl) ?? "/home";
  return (
    <div className="card p-6 sm:p-8">
      <h1 className="text-2xl">Check your e-mail</h1>
      {email && params.unsent === "1" ? (
        <p role="alert" className="mt-3 rounded-lg border border-brick-300 bg-brick-100 px-3 py-2 text-sm text-brick-800">
          Your account is made, but the link to <strong>{email}</strong> did not go out. Send it again below; your password works once
          you have opened it.
        </p>
      ) : email ? (
        <p className="mt-3 text-ink-700">
          We sent a link to <strong>{email}</strong>. Opening it proves the address is yours and signs you in. Open it on this device
          within 30 minutes; it works once.
        </p>
      ) : (
        <p className="mt-3 text-ink-700">We sent you a sign-in link. Open it on this device within 30 minutes. It works once.</p>
      )}
      {email ? <SendAgain email={email} callbackUrl={callbackUrl} /> : null}
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="text-patina-700 hover:underline">
          Back to sign in
        </Link>
      </p>
    </div>
  );
}
