import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { and, count, eq, gt, inArray, isNull } from "drizzle-orm";
import { can, keepsAnOwner, type ShopRole } from "@/lib/access";
import { db } from "../client";
import { clientContacts, clients, invitations, jobs, memberships, shops, users } from "../schema";
import { recordAudit } from "./audit";
import { normalizeEmail } from "./users";

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export function slugify(name: string): string {
  const base = name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40);
  return base || "shop";
}

async function uniqueSlug(name: string): Promise<string> {
  const base = slugify(name);
  for (let attempt = 0; attempt < 20; attempt += 1) {
    const candidate = attempt === 0 ? base : `${base}-${attempt + 1}`;
    const [taken] = await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, candidate)).limit(1);
    if (!taken) return candidate;
  }
  return `${base}-${randomBytes(3).toString("hex")}`;
}

export class EmailTakenError extends Error {
  constructor() {
    super("An account with this e-mail already exists. Sign in instead.");
  }
}

/**
 * Sign-up: a new user and a new shop, with the user as its owner, in one transaction. The address
 * is not proven yet (emailVerified stays empty): the account cannot sign in with its password, nor
 * gets any contact's jobs, until its owner opens the link e-mailed to it.
 */
export async function createShopWithOwner(input: {
  shopName: string;
  name: string;
  email: string;
  passwordHash: string;
  /** The shop's clock (checked by the caller); the column defaults otherwise. */
  timeZone?: string;
  locale?: string;
}): Promise<{ userId: string; shopSlug: string }> {
  const email = normalizeEmail(input.email);
  const slug = await uniqueSlug(input.shopName);
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, email)).limit(1);
    if (existing) throw new EmailTakenError();
    const [user] = await tx
      .insert(users)
      .values({ email, name: input.name, passwordHash: input.passwordHash })
      .returning({ id: users.id });
    const [shop] = await tx
      .insert(shops)
      .values({ name: input.shopName, slug, ...(input.timeZone ? { timeZone: input.timeZone } : {}), ...(input.locale ? { locale: input.locale } : {}) })
      .returning({ id: shops.id });
    await tx.insert(memberships).values({ shopId: shop!.id, userId: user!.id, role: "owner" });
    await recordAudit({ shopId: shop!.id, actorUserId: user!.id, action: "shop.created", subjectType: "shop", subjectId: shop!.id }, tx);
    return { userId: user!.id, shopSlug: slug };
  });
}

export async function shopOverview({ shopId }: { shopId: string }) {
  const [clientCount] = await db
    .select({ n: count() })
    .from(clients)
    .where(and(eq(clients.shopId, shopId), eq(clients.archived, false)));
  const [memberCount] = await db.select({ n: count() }).from(memberships).where(eq(memberships.shopId, shopId));
  const [openJobs] = await db
    .select({ n: count() })
    .from(jobs)
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.status, ["drafting", "with-client", "cleared", "on-press"])));
  return { clients: clientCount?.n ?? 0, members: memberCount?.n ?? 0, openJobs: openJobs?.n ?? 0 };
}

export async function listMembers({ shopId }: { shopId: string }) {
  return db
    .select({ id: memberships.id, role: memberships.role, userId: users.id, name: users.name, email: users.email, since: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .orderBy(users.name);
}

export async function listOpenInvitations({ shopId }: { shopId: string }) {
  return db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt })
    .from(invitations)
    .where(and(eq(invitations.shopId, shopId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
    .orderBy(invitations.createdAt);
}

export async function createInvitation(input: {
  shopId: string;
  email: string;
  role: "owner" | "designer" | "production";
  invitedBy: string;
}): Promise<{ token: string; invitationId: string }> {
  const token = randomBytes(32).toString("base64url");
  const [row] = await db
    .insert(invitations)
    .values({
      shopId: input.shopId,
      email: normalizeEmail(input.email),
      role: input.role,
      invitedBy: input.invitedBy,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + 7 * 24 * 3600 * 1000),
    })
    .returning({ id: invitations.id });
  await recordAudit({
    shopId: input.shopId,
    actorUserId: input.invitedBy,
    action: "member.invited",
    subjectType: "invitation",
    subjectId: row!.id,
    detail: { email: normalizeEmail(input.email), role: input.role },
  });
  return { token, invitationId: row!.id };
}

export async function findInvitation({ token }: { token: string }) {
  const [row] = await db
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      shopId: shops.id,
      shopName: shops.name,
      shopSlug: shops.slug,
    })
    .from(invitations)
    .innerJoin(shops, eq(shops.id, invitations.shopId))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .limit(1);
  return row;
}

export type AcceptInvitationResult =
  | { ok: true; shopSlug: string; email: string }
  | { ok: false; message: string; reason?: "sign-in-as-invitee" };

/**
 * Accepts an invitation. When no account has the invited address yet, makes one with the name and
 * password given: the token came by e-mail to that address, so the address is proven, and the
 * client contacts filed under it are linked to the new account. When an account has it, only that
 * account, signed in (`signedInUserId`), may accept: the token alone does not show that whoever
 * holds it controls the account, which may have been made by someone else before the invitation.
 */
export async function acceptInvitation(input: {
  token: string;
  name?: string;
  passwordHash?: string;
  signedInUserId?: string | null;
}): Promise<AcceptInvitationResult> {
  const invite = await findInvitation({ token: input.token });
  if (!invite) return { ok: false, message: "This invitation link is not valid." };
  if (invite.acceptedAt) return { ok: false, message: "This invitation has already been used." };
  if (invite.expiresAt < new Date()) return { ok: false, message: "This invitation has expired. Ask the shop owner for a new one." };
  return db.transaction(async (tx) => {
    // Takes its turn with the shop's other team changes, then checks the invitation is still open:
    // an owner may have withdrawn it, or a second click accepted it, since it was read above.
    await lockTeam(tx, invite.shopId);
    const [open] = await tx
      .select({ id: invitations.id })
      .from(invitations)
      .where(and(eq(invitations.id, invite.id), isNull(invitations.acceptedAt)))
      .for("update");
    if (!open) return { ok: false as const, message: "This invitation can no longer be used. Ask the shop owner for a new one." };
    let [user] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invite.email)).limit(1);
    if (user && user.id !== input.signedInUserId) {
      return { ok: false as const, reason: "sign-in-as-invitee" as const, message: signInAsInviteeMessage(invite.email) };
    }
    if (!user) {
      if (!input.passwordHash || !input.name) return { ok: false as const, message: "Choose a name and a password to join." };
      [user] = await tx
        .insert(users)
        .values({ email: invite.email, name: input.name, passwordHash: input.passwordHash, emailVerified: new Date() })
        .returning({ id: users.id });
      await tx.update(clientContacts).set({ userId: user!.id }).where(eq(clientContacts.email, invite.email));
    }
    // Someone already on the team takes the invitation's role, unless that would leave no owner.
    const [current] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.shopId, invite.shopId), eq(memberships.userId, user!.id)))
      .for("update");
    if (current && !keepsAnOwner(await countOwners(tx, invite.shopId), current.role, { kind: "role", role: invite.role })) {
      return { ok: false as const, message: "You are this shop's only owner, so this invitation cannot change your role. Make someone else an owner first." };
    }
    await tx
      .insert(memberships)
      .values({ shopId: invite.shopId, userId: user!.id, role: invite.role })
      .onConflictDoUpdate({ target: [memberships.shopId, memberships.userId], set: { role: invite.role } });
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, invite.id));
    await recordAudit(
      { shopId: invite.shopId, actorUserId: user!.id, action: "member.joined", subjectType: "invitation", subjectId: invite.id, detail: { role: invite.role } },
      tx,
    );
    return { ok: true as const, shopSlug: invite.shopSlug, email: invite.email };
  });
}

export function signInAsInviteeMessage(email: string): string {
  return `An account for ${email} already exists. Sign in as ${email} first, then accept the invitation.`;
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * Changes to one shop's team take turns: each locks the shop's row before it reads who the owners
 * are, so two changes at once can never both count an owner that the other is taking away. NO KEY
 * UPDATE, so rows that only reference the shop (new jobs, clients) are not held up meanwhile.
 */
async function lockTeam(tx: Tx, shopId: string): Promise<void> {
  await tx.select({ id: shops.id }).from(shops).where(eq(shops.id, shopId)).for("no key update");
}

async function countOwners(tx: Tx, shopId: string): Promise<number> {
  const [row] = await tx
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.shopId, shopId), eq(memberships.role, "owner")));
  return row?.n ?? 0;
}

/** One member of the shop's team, its row locked until the transaction ends; undefined when not in this shop. */
async function lockMember(tx: Tx, shopId: string, membershipId: string) {
  const [row] = await tx
    .select({ id: memberships.id, userId: memberships.userId, role: memberships.role, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.id, membershipId), eq(memberships.shopId, shopId)))
    .for("update", { of: memberships });
  return row;
}

/**
 * Whether the person making a team change still may, read under the team lock: access was resolved
 * before the transaction, and an owner demoted a moment ago must not finish a change of their own.
 */
async function stillManages(tx: Tx, shopId: string, userId: string): Promise<boolean> {
  const [row] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)));
  return Boolean(row && can(row.role, "members.manage"));
}

export type TeamMember = { id: string; userId: string; email: string; name: string | null; role: ShopRole };
export type TeamChangeRefusal = "forbidden" | "not-found" | "last-owner";
export type TeamChangeResult =
  | { ok: true; member: TeamMember; previousRole: ShopRole; changed: boolean }
  | { ok: false; reason: TeamChangeRefusal };

/** Gives a member of the shop another role; the last owner keeps theirs. */
export async function changeMemberRole(input: { shopId: string; membershipId: string; role: ShopRole; actorUserId: string }): Promise<TeamChangeResult> {
  return db.transaction(async (tx) => {
    await lockTeam(tx, input.shopId);
    if (!(await stillManages(tx, input.shopId, input.actorUserId))) return { ok: false as const, reason: "forbidden" as const };
    const member = await lockMember(tx, input.shopId, input.membershipId);
    if (!member) return { ok: false as const, reason: "not-found" as const };
    if (member.role === input.role) return { ok: true as const, member, previousRole: member.role, changed: false };
    if (!keepsAnOwner(await countOwners(tx, input.shopId), member.role, { kind: "role", role: input.role })) {
      return { ok: false as const, reason: "last-owner" as const };
    }
    await tx.update(memberships).set({ role: input.role }).where(eq(memberships.id, member.id));
    await recordAudit(
      {
        shopId: input.shopId,
        actorUserId: input.actorUserId,
        action: "member.role-changed",
        subjectType: "membership",
        subjectId: member.id,
        detail: { userId: member.userId, email: member.email, from: member.role, role: input.role },
      },
      tx,
    );
    return { ok: true as const, member: { ...member, role: input.role }, previousRole: member.role, changed: true };
  });
}

/** Takes a member off the shop's team; the last owner stays. Their account and their work in the shop remain. */
export async function removeMember(input: { shopId: string; membershipId: string; actorUserId: string }): Promise<TeamChangeResult> {
  return db.transaction(async (tx) => {
    await lockTeam(tx, input.shopId);
    if (!(await stillManages(tx, input.shopId, input.actorUserId))) return { ok: false as const, reason: "forbidden" as const };
    const member = await lockMember(tx, input.shopId, input.membershipId);
    if (!member) return { ok: false as const, reason: "not-found" as const };
    if (!keepsAnOwner(await countOwners(tx, input.shopId), member.role, { kind: "remove" })) return { ok: false as const, reason: "last-owner" as const };
    await tx.delete(memberships).where(eq(memberships.id, member.id));
    await recordAudit(
      {
        shopId: input.shopId,
        actorUserId: input.actorUserId,
        action: "member.removed",
        subjectType: "membership",
        subjectId: member.id,
        detail: { userId: member.userId, email: member.email, role: member.role },
      },
      tx,
    );
    return { ok: true as const, member, previousRole: member.role, changed: true };
  });
}

/**
 * Withdraws an open invitation of the shop: its row goes, so its link no longer works (the audit
 * log keeps who was invited). Not found when there is no such open invitation in this shop.
 */
export async function withdrawInvitation(input: {
  shopId: string;
  invitationId: string;
  actorUserId: string;
}): Promise<{ ok: true; invitation: { id: string; email: string; role: ShopRole } } | { ok: false; reason: "forbidden" | "not-found" }> {
  return db.transaction(async (tx) => {
    await lockTeam(tx, input.shopId);
    if (!(await stillManages(tx, input.shopId, input.actorUserId))) return { ok: false as const, reason: "forbidden" as const };
    const [row] = await tx
      .delete(invitations)
      .where(and(eq(invitations.id, input.invitationId), eq(invitations.shopId, input.shopId), isNull(invitations.acceptedAt)))
      .returning({ id: invitations.id, email: invitations.email, role: invitations.role });
    if (!row) return { ok: false as const, reason: "not-found" as const };
    await recordAudit(
      {
        shopId: input.shopId,
        actorUserId: input.actorUserId,
        action: "member.invitation-withdrawn",
        subjectType: "invitation",
        subjectId: row.id,
        detail: { email: row.email, role: row.role },
      },
      tx,
    );
    return { ok: true as const, invitation: row };
  });
}

export async function findShopById({ shopId }: { shopId: string }) {
  const [row] = await db.select({ id: shops.id, slug: shops.slug, name: shops.name, locale: shops.locale, timeZone: shops.timeZone }).from(shops).where(eq(shops.id, shopId)).limit(1);
  return row;
}

/** The shop's locale and time zone, checked by the caller (lib/dates.ts). */
export async function saveShopClock({ shopId, locale, timeZone }: { shopId: string; locale: string; timeZone: string }) {
  await db.update(shops).set({ locale, timeZone }).where(eq(shops.id, shopId));
}
