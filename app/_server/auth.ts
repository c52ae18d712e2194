import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import { getServerSession } from "next-auth";
import type { Adapter } from "next-auth/adapters";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { z } from "zod";
import { getDb } from "@/db/client";
import { linkContactsToUser, listMemberships } from "@/db/queries/access";
import { findUserByEmail, normalizeEmail } from "@/db/queries/users";
import { accounts, sessions, users, verificationTokens } from "@/db/schema";
import { composeMail } from "./emails";
import { sendMail } from "./mail";
import { findContactByEmail } from "@/db/queries/contacts";
import { parseInput } from "@/lib/input";
import { formatShopDate } from "@/lib/dates";

const credentialsSchema = z.object({
  email: z.string().trim().email(),
  password: z.string().min(1).max(200),
});

/** Shown when password attempts from an address, or for an account, are used up (limits in rate-limit.ts). */
export const SIGN_IN_LIMIT_MESSAGE = "Too many sign-in attempts. Wait a few minutes and try again, or sign in with an e-mail link.";
export const SIGN_IN_LINK_LIMIT_MESSAGE = "Too many sign-in links asked for. Wait a while and try again, or use your password.";

const linkEmailSchema = z.string().trim().email().max(320);

/**
 * The address a sign-in link goes to, exactly as next-auth will use it (it is the provider's
 * normalizer) and as the per-recipient limit counts it; null for anything that is not one plain
 * address, which gets no e-mail.
 */
export function signInLinkRecipient(raw: unknown): string | null {
  const parsed = parseInput(linkEmailSchema, raw);
  return parsed.success ? normalizeEmail(parsed.data) : null;
}

/**
 * What the credentials provider answers (as next-auth's `error`) when the password is right but the
 * account's address was never proven: the sign-in form explains it and offers to send the link again.
 */
export const EMAIL_UNPROVEN = "EmailUnproven";

/**
 * The e-mail with a sign-in link. For an account whose address is not proven yet, the mail says
 * which shop was started with the address and that opening the link confirms it: whoever opens it
 * takes on that account, so it must never read as an ordinary sign-in.
 */
async function signInLinkMail(identifier: string, url: string) {
  const user = await findUserByEmail({ email: identifier });
  if (user && !user.emailVerified) {
    const shops = (await listMemberships({ userId: user.id })).filter((m) => m.role === "owner").map((m) => `“${m.shopName}”`);
    const started = formatShopDate(user.createdAt);
    return composeMail({
      to: identifier,
      subject: "Confirm your e-mail address for Chalkline",
      heading: "Is this your address?",
      paragraphs: [
        shops.length
          ? `The shop ${shops.join(", ")} was started on Chalkline on ${started} with this e-mail address.`
          : `A Chalkline account was made with this e-mail address on ${started}.`,
        "Open the link below to confirm the address is yours and sign in. The link works once and expires in 30 minutes.",
      ],
      action: { label: "Confirm and sign in", url },
      footnote: "If you did not start this, do not open the link: the account cannot be used until the address is confirmed.",
    });
  }
  return composeMail({
    to: identifier,
    subject: "Your Chalkline sign-in link",
    heading: "Sign in to Chalkline",
    paragraphs: ["Use the button below to sign in. The link works once and expires in 30 minutes."],
    action: { label: "Sign in", url },
    footnote: "If you did not ask for this, you can ignore this e-mail.",
  });
}

let options: NextAuthOptions | undefined;

/**
 * Session cookies: next-auth's own, httpOnly and SameSite=Lax. When the app's URL is https they are
 * also Secure and carry the __Secure- / __Host- prefixes (`useSecureCookies`); on plain http (local
 * development and tests) the browser would drop Secure cookies, so they are not.
 */
export function usesSecureCookies(env: Record<string, string | undefined> = process.env): boolean {
  return (env.NEXTAUTH_URL ?? env.APP_URL ?? "").startsWith("https://");
}

/** The session, callback and CSRF cookies, spelled out so the policy is ours and tested (the names are next-auth's). */
export function authCookies(secure: boolean): NonNullable<NextAuthOptions["cookies"]> {
  const options = { httpOnly: true, sameSite: "lax" as const, path: "/", secure };
  const prefix = secure ? "__Secure-" : "";
  return {
    sessionToken: { name: `${prefix}next-auth.session-token`, options },
    callbackUrl: { name: `${prefix}next-auth.callback-url`, options },
    // __Host-: only ever sent to this exact host, over https, for the whole site.
    csrfToken: { name: `${secure ? "__Host-" : ""}next-auth.csrf-token`, options },
  };
}

/**
 * emailVerified records when the address was first proven. Each e-mail sign-in asks the adapter to
 * set it to now; for an address proven already that keeps the first date instead.
 */
function keepFirstProof(adapter: Adapter): Adapter {
  const update = adapter.updateUser!.bind(adapter);
  return {
    ...adapter,
    updateUser: async (user) => {
      if (user.emailVerified && user.id) {
        const current = await adapter.getUser!(user.id);
        if (current?.emailVerified) {
          const rest = { ...user };
          delete rest.emailVerified;
          return Object.keys(rest).length > 1 ? update(rest) : current;
        }
      }
      return update(user);
    },
  };
}

export function getAuthOptions(): NextAuthOptions {
  if (options) return options;
  const secure = usesSecureCookies();
  options = {
    adapter: keepFirstProof(
      DrizzleAdapter(getDb(), {
        usersTable: users,
        accountsTable: accounts,
        sessionsTable: sessions,
        verificationTokensTable: verificationTokens,
      }) as unknown as Adapter,
    ),
    secret: process.env.NEXTAUTH_SECRET ?? process.env.AUTH_SECRET,
    session: { strategy: "jwt", maxAge: 30 * 24 * 3600 },
    useSecureCookies: secure,
    cookies: authCookies(secure),
    pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-email", error: "/sign-in" },
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(raw) {
          const parsed = parseInput(credentialsSchema, raw);
          if (!parsed.success) return null;
          // Failed attempts are counted per client address and per account in the route handler,
          // from the same fields, before this runs (429 past either limit).
          const email = normalizeEmail(parsed.data.email);
          const user = await findUserByEmail({ email });
          if (!user?.passwordHash) return null;
          const ok = await bcrypt.compare(parsed.data.password, user.passwordHash);
          if (!ok) return null;
          // A password chosen at sign-up counts only once the address is proven by the e-mailed link;
          // said only to someone who knows the password, so it tells a stranger nothing.
          if (!user.emailVerified) throw new Error(EMAIL_UNPROVEN);
          return { id: user.id, email: user.email, name: user.name };
        },
      }),
      EmailProvider({
        from: process.env.MAIL_FROM ?? "Chalkline <proofs@chalkline.test>",
        // The transport is ours (see mail.ts); the provider only needs a value here.
        server: process.env.SMTP_URL ?? { host: "127.0.0.1", port: Number(process.env.MAIL_FAKE_SMTP_PORT ?? 25) },
        maxAge: 30 * 60,
        normalizeIdentifier(identifier) {
          const recipient = signInLinkRecipient(identifier);
          if (!recipient) throw new Error("Not an e-mail address.");
          return recipient;
        },
        async sendVerificationRequest({ identifier, url }) {
          await sendMail(await signInLinkMail(identifier, url));
        },
      }),
    ],
    callbacks: {
      async signIn({ user, account }) {
        if (account?.provider !== "email") return true;
        const email = normalizeEmail(user.email ?? "");
        // Links go only to people the product knows: members, or contacts a shop has added.
        if (await findUserByEmail({ email })) return true;
        if (await findContactByEmail({ email })) return true;
        return "/sign-in?error=NoAccount";
      },
      async jwt({ token, user }) {
        if (user?.id) token.uid = user.id;
        return token;
      },
      async session({ session, token }) {
        if (session.user && typeof token.uid === "string") {
          (session.user as { id?: string }).id = token.uid;
        }
        return session;
      },
    },
    events: {
      // By now an e-mail sign-in has set emailVerified (the adapter does, before this event); the
      // contacts filed under a proven address are linked, and nobody else's.
      async signIn({ user }) {
        if (user.id) await linkContactsToUser({ userId: user.id });
      },
    },
  };
  return options;
}

export type SessionUser = { id: string; email: string; name: string | null };

export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(getAuthOptions());
  const user = session?.user as { id?: string; email?: string | null; name?: string | null } | undefined;
  if (!user?.id || !user.email) return null;
  return { id: user.id, email: user.email, name: user.name ?? null };
}
