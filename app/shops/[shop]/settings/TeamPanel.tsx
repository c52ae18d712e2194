"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useHydrated } from "@/components/orders/useHydrated";
import { EmptyState } from "@/components/ui/EmptyState";
import { ROLE_LABELS, SHOP_ROLES, type ShopRole } from "@/lib/access";
import { changeMemberRoleAction, removeMemberAction, withdrawInvitationAction } from "./actions";

export type TeamMemberView = { id: string; name: string | null; email: string; role: ShopRole; you: boolean };
export type OpenInvitationView = { id: string; email: string; role: ShopRole; until: string };

type Notice = { tone: "ok" | "error"; text: string };
type Confirming = { memberId: string; kind: "remove" } | { memberId: string; kind: "role"; role: ShopRole };

/** The team with a role picker and a remove step per member, and the invitations still open. */
export function TeamPanel({ shopSlug, shopName, members, invitations }: { shopSlug: string; shopName: string; members: TeamMemberView[]; invitations: OpenInvitationView[] }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [notice, setNotice] = useState<Notice | null>(null);
  const [confirming, setConfirming] = useState<Confirming | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  // What this screen already knows changed, until the server's fresh list arrives.
  const [roles, setRoles] = useState<Record<string, ShopRole>>({});
  const [gone, setGone] = useState<string[]>([]);

  const [listed, setListed] = useState({ members, invitations });
  if (listed.members !== members || listed.invitations !== invitations) {
    setListed({ members, invitations });
    setRoles({});
    setGone([]);
  }

  const shownMembers = members.filter((m) => !gone.includes(m.id));
  const shownInvitations = invitations.filter((i) => !gone.includes(i.id));

  async function changeRole(member: TeamMemberView, role: ShopRole) {
    setConfirming(null);
    setBusy(member.id);
    setNotice(null);
    setRoles((r) => ({ ...r, [member.id]: role }));
    const result = await changeMemberRoleAction({ shopSlug, memberId: member.id, role });
    setBusy(null);
    if (!result.ok) {
      setRoles((r) => Object.fromEntries(Object.entries(r).filter(([id]) => id !== member.id)));
      setNotice({ tone: "error", text: result.error });
      return;
    }
    setNotice({ tone: "ok", text: result.data.message });
    if (result.data.self && result.data.changed) router.push(`/shops/${shopSlug}`);
  }

  async function remove(member: TeamMemberView) {
    setConfirming(null);
    setBusy(member.id);
    setNotice(null);
    const result = await removeMemberAction({ shopSlug, memberId: member.id });
    setBusy(null);
    if (!result.ok) {
      setNotice({ tone: "error", text: result.error });
      return;
    }
    setGone((g) => [...g, member.id]);
    setNotice({ tone: "ok", text: result.data.message });
    if (result.data.self) router.push("/home");
  }

  async function withdraw(invitation: OpenInvitationView) {
    setBusy(invitation.id);
    setNotice(null);
    const result = await withdrawInvitationAction({ shopSlug, invitationId: invitation.id });
    setBusy(null);
    if (!result.ok) {
      setNotice({ tone: "error", text: result.error });
      return;
    }
    setGone((g) => [...g, invitation.id]);
    setNotice({ tone: "ok", text: result.data.message });
  }

  function pickRole(member: TeamMemberView, role: ShopRole) {
    // Giving up one's own owner role takes a second step: the settings close behind it.
    if (member.you && member.role === "owner" && role !== "owner") {
      setNotice(null);
      setConfirming({ memberId: member.id, kind: "role", role });
      return;
    }
    void changeRole(member, role);
  }

  return (
    <div data-hydrated={hydrated}>
      {/* Both regions stay in the page, so what appears in them is read out. */}
      <div aria-live="polite" role="status">
        {notice?.tone === "ok" ? <p className="mb-3 rounded-lg bg-patina-100 px-3 py-2 text-sm text-patina-800">{notice.text}</p> : null}
      </div>
      <div role="alert">
        {notice?.tone === "error" ? <p className="mb-3 rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800">{notice.text}</p> : null}
      </div>

      <ul className="card divide-y divide-paper-200" aria-label="Team members">
        {shownMembers.map((m) => {
          const who = m.name ?? m.email;
          const role = roles[m.id] ?? m.role;
          const asking = confirming?.memberId === m.id ? confirming : null;
          return (
            <li key={m.id} className="px-4 py-3">
              <div className="flex flex-wrap items-center justify-between gap-3">
                <span>
                  <span className="block font-medium">
                    {who}
                    {m.you ? <span className="ml-2 text-xs font-normal text-ink-500">(you)</span> : null}
                  </span>
                  <span className="block text-sm text-ink-500">{m.email}</span>
                </span>
                <span className="flex items-center gap-2">
                  <label htmlFor={`role-${m.id}`} className="sr-only">
                    Role of {who}
                  </label>
                  <select
                    id={`role-${m.id}`}
                    className="field-input w-auto py-1.5 text-sm"
                    value={asking?.kind === "role" ? asking.role : role}
                    disabled={busy === m.id}
                    onChange={(e) => pickRole(m, e.target.value as ShopRole)}
                  >
                    {SHOP_ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                  <button
                    type="button"
                    className="btn-quiet px-3 py-1.5 text-brick-700"
                    disabled={busy === m.id}
                    aria-label={m.you ? "Leave this shop" : `Remove ${who}`}
                    onClick={() => {
                      setNotice(null);
                      setConfirming({ memberId: m.id, kind: "remove" });
                    }}
                  >
                    {m.you ? "Leave" : "Remove"}
                  </button>
                </span>
              </div>
              {asking ? (
                <div className="mt-3 rounded-lg border border-paper-300 bg-paper-50 p-3 text-sm" role="group" aria-label={asking.kind === "remove" ? `Confirm removing ${who}` : "Confirm your new role"}>
                  <p className="text-ink-800">
                    {asking.kind === "remove"
                      ? m.you
                        ? `Leave ${shopName}? You will no longer see its jobs, proofs or settings.`
                        : `Take ${who} off the team? Their account and the work they did stay; they lose access to ${shopName}.`
                      : `Become ${ROLE_LABELS[asking.role].toLowerCase()}? You will no longer see shop settings or manage the team.`}
                  </p>
                  <div className="mt-2 flex flex-wrap gap-2">
                    {asking.kind === "remove" ? (
                      <button type="button" className="btn-danger px-3 py-1.5" onClick={() => void remove(m)}>
                        {m.you ? "Yes, leave the shop" : `Yes, remove ${who}`}
                      </button>
                    ) : (
                      <button type="button" className="btn-danger px-3 py-1.5" onClick={() => void changeRole(m, asking.role)}>
                        Yes, change my role
                      </button>
                    )}
                    <button type="button" className="btn-quiet px-3 py-1.5" onClick={() => setConfirming(null)}>
                      Cancel
                    </button>
                  </div>
                </div>
              ) : null}
            </li>
          );
        })}
      </ul>

      <h2 className="mb-3 mt-8 text-lg">Waiting to join</h2>
      {shownInvitations.length === 0 ? (
        <EmptyState title="No open invitations">Invite designers and press operators with the form.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200" aria-label="Open invitations">
          {shownInvitations.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3 text-sm">
              <span>
                <span className="block">{i.email}</span>
                <span className="block text-ink-500">
                  {ROLE_LABELS[i.role]} · until {i.until}
                </span>
              </span>
              <button type="button" className="btn-quiet px-3 py-1.5" disabled={busy === i.id} aria-label={`Withdraw the invitation to ${i.email}`} onClick={() => void withdraw(i)}>
                Withdraw
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
