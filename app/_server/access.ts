import "server-only";
import { forbidden, notFound, redirect } from "next/navigation";
import { cache } from "react";
import { NextResponse } from "next/server";
import { listClientContacts, listMemberships, type ActorContact, type ActorMembership } from "@/db/queries/access";
import { can, type Permission, type ShopRole } from "@/lib/access";
import { getSessionUser, type SessionUser } from "./auth";

/**
 * The one place where the server decides who may see or do what.
 * Pages, server actions and route handlers all resolve access through `resolveShopAccess`.
 */
export type Actor = SessionUser & { memberships: ActorMembership[]; contacts: ActorContact[] };

export const getActor = cache(async (): Promise<Actor | null> => {
  const user = await getSessionUser();
  if (!user) return null;
  const [memberships, contacts] = await Promise.all([
    listMemberships({ userId: user.id }),
    listClientContacts({ userId: user.id }),
  ]);
  return { ...user, memberships, contacts };
});

export type ShopAccess = {
  actor: Actor;
  /** `clock`: how the shop writes dates (lib/dates.ts) and money (lib/money.ts). */
  shop: { id: string; slug: string; name: string; clock: { locale: string; timeZone: string } };
  role: ShopRole;
};

export type AccessDenied = { kind: "anonymous" | "forbidden" | "not-found"; message: string };
export type AccessResult = { kind: "ok"; access: ShopAccess } | AccessDenied;

export async function resolveShopAccess(shopSlug: string, permission: Permission): Promise<AccessResult> {
  const actor = await getActor();
  if (!actor) return { kind: "anonymous", message: "Sign in to continue." };
  const membership = actor.memberships.find((m) => m.shopSlug === shopSlug);
  if (membership) {
    if (!can(membership.role, permission)) {
      return { kind: "forbidden", message: "Your role in this shop does not allow this." };
    }
    return {
      kind: "ok",
      access: { actor, role: membership.role, shop: { id: membership.shopId, slug: membership.shopSlug, name: membership.shopName, clock: { locale: membership.locale, timeZone: membership.timeZone } } },
    };
  }
  // A client of this shop knows it exists but may not use its workspace.
  if (actor.contacts.some((c) => c.shopSlug === shopSlug)) {
    return { kind: "forbidden", message: "This part of the shop is for its team. Your proofs are under My jobs." };
  }
  return { kind: "not-found", message: "Not found." };
}

/** Resolves access by shop id (for routes addressed by a record id rather than a slug). */
export async function resolveShopAccessById(shopId: string, permission: Permission): Promise<AccessResult> {
  const actor = await getActor();
  if (!actor) return { kind: "anonymous", message: "Sign in to continue." };
  const slug =
    actor.memberships.find((m) => m.shopId === shopId)?.shopSlug ?? actor.contacts.find((c) => c.shopId === shopId)?.shopSlug;
  if (!slug) return { kind: "not-found", message: "Not found." };
  return resolveShopAccess(slug, permission);
}

/** For server components: sends anonymous visitors to sign in, renders the 403 or 404 page otherwise. */
export async function requireShopPage(shopSlug: string, permission: Permission, returnTo?: string): Promise<ShopAccess> {
  const result = await resolveShopAccess(shopSlug, permission);
  return settlePage(result, returnTo ?? `/shops/${shopSlug}`);
}

export function settlePage(result: AccessResult, returnTo: string): ShopAccess {
  if (result.kind === "ok") return result.access;
  if (result.kind === "anonymous") redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
  if (result.kind === "forbidden") forbidden();
  notFound();
}

export async function requireActorPage(returnTo: string): Promise<Actor> {
  const actor = await getActor();
  if (!actor) redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
  return actor;
}

const STATUS: Record<AccessDenied["kind"], number> = { anonymous: 401, forbidden: 403, "not-found": 404 };

/** For route handlers: a JSON error response, or null when access is granted. */
export function deniedResponse(result: AccessDenied): NextResponse {
  return NextResponse.json({ error: result.message }, { status: STATUS[result.kind] });
}

/** Result shape shared by every server action. */
export type ActionResult<T = undefined> =
  | { ok: true; data: T }
  | { ok: false; error: string; fieldErrors?: Record<string, string[] | undefined>; status?: number };

export function deniedAction(result: AccessDenied): ActionResult<never> {
  return { ok: false, error: result.message, status: STATUS[result.kind] };
}

/** Where a signed-in person lands: their first shop, or their jobs as a client. */
export function homePathFor(actor: Actor): string {
  const first = actor.memberships[0];
  if (first) return `/shops/${first.shopSlug}`;
  if (actor.contacts.length > 0) return "/portal";
  return "/welcome";
}
