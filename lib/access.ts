/**
 * Who may do what. Pure data and functions: the server resolves the actor and asks here.
 * A shop member has one role per shop; a client contact acts as "client" and sees only their own jobs.
 */
export const SHOP_ROLES = ["owner", "designer", "production"] as const;
export type ShopRole = (typeof SHOP_ROLES)[number];
export type ActorRole = ShopRole | "client";

export const PERMISSIONS = [
  "shop.view",
  "shop.settings",
  "members.invite",
  "members.manage",
  "clients.view",
  "clients.edit",
  "jobs.view",
  "jobs.edit",
  "proofs.edit",
  "blanks.view",
  "blanks.edit",
  "production.view",
  "production.grade",
  "prices.view",
  "prices.edit",
  "audit.view",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const GRANTS: Record<ActorRole, readonly Permission[]> = {
  owner: PERMISSIONS,
  designer: [
    "shop.view",
    "clients.view",
    "clients.edit",
    "jobs.view",
    "jobs.edit",
    "proofs.edit",
    "blanks.view",
    "blanks.edit",
    "production.view",
    "production.grade",
    "prices.view",
  ],
  // The press applies the print plan's grading: it chooses which transfer or screen sizes to make.
  production: ["shop.view", "jobs.view", "blanks.view", "production.view", "production.grade"],
  // Clients never hold shop permissions; their own jobs are checked by ownership, not by role.
  client: [],
};

export function can(role: ActorRole, permission: Permission): boolean {
  return GRANTS[role].includes(permission);
}

export const ROLE_LABELS: Record<ActorRole, string> = {
  owner: "Owner",
  designer: "Designer",
  production: "Production",
  client: "Client",
};

export const ROLE_DESCRIPTIONS: Record<ShopRole, string> = {
  owner: "Runs the shop: prices, members, settings and everything else.",
  designer: "Builds proofs, places art and talks with clients. Sees prices, cannot change them.",
  production: "Sees jobs, quantities and production specs. No prices.",
};

/** Said whenever a change to the team would leave the shop without an owner. */
export const LAST_OWNER_MESSAGE = "A shop needs at least one owner. Make someone else an owner first.";

/** A change to one member of a shop's team: a new role, or off the team. */
export type TeamChange = { kind: "role"; role: ShopRole } | { kind: "remove" };

/**
 * How many owners a shop has after one member's change. A change stands only if this stays above
 * zero, so the last owner can be neither removed nor given another role (product rule, no outside source).
 */
export function ownersAfter(ownerCount: number, memberRole: ShopRole, change: TeamChange): number {
  if (memberRole !== "owner") return ownerCount + (change.kind === "role" && change.role === "owner" ? 1 : 0);
  return change.kind === "role" && change.role === "owner" ? ownerCount : ownerCount - 1;
}

export function keepsAnOwner(ownerCount: number, memberRole: ShopRole, change: TeamChange): boolean {
  return ownersAfter(ownerCount, memberRole, change) > 0;
}

export type NavItem = { key: string; label: string; href: string };

/** Navigation for a shop member, built from the same permission table the server enforces. */
export function shopNav(role: ShopRole, shopSlug: string): NavItem[] {
  const base = `/shops/${shopSlug}`;
  const items: Array<NavItem & { needs: Permission }> = [
    { key: "overview", label: "Overview", href: base, needs: "shop.view" },
    { key: "jobs", label: "Jobs", href: `${base}/jobs`, needs: "jobs.view" },
    { key: "art", label: "Art library", href: `${base}/art`, needs: "jobs.view" },
    { key: "clients", label: "Clients", href: `${base}/clients`, needs: "clients.view" },
    { key: "blanks", label: "Blanks", href: `${base}/blanks`, needs: "blanks.view" },
    { key: "prices", label: "Prices", href: `${base}/prices`, needs: "prices.view" },
    { key: "settings", label: "Shop settings", href: `${base}/settings`, needs: "shop.settings" },
  ];
  return items.filter((item) => can(role, item.needs)).map(({ key, label, href }) => ({ key, label, href }));
}
