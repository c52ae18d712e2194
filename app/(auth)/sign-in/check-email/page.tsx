import Link from "next/link";

export const metadata = { title: "Check your e-mail" };

export default function CheckEmailPage() {
  return (
    <div className="card p-6 sm:p-8">
      <h1 className="text-2xl">Check your e-mail</h1>
      <p className="mt-3 text-ink-700">
        We sent you a sign-in link. Open it on this device within 30 minutes. It works once.
      </p>
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="text-patina-700 hover:underline">
          Back to sign in
        </Link>
      </p>
    </div>
  );
}
