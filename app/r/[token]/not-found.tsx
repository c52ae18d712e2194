import { Logo } from "@/components/ui/Logo";

export default function ReviewLinkNotFound() {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-gutter">
      <Logo />
      <h1 className="mt-10 text-2xl">This review link does not work</h1>
      <p className="mt-2 text-ink-700">
        It may have been withdrawn by the print shop, it may have expired, or part of it was lost when it was copied. Ask the print shop to send you a new link.
      </p>
    </main>
  );
}
