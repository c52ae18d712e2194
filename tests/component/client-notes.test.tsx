import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it } from "vitest";
import { ClientNotes } from "@/components/editor/ClientNotes";
import { fakeFetch, renderWithQuery, TYPED_MARKUP } from "./support";

const NOTES_URL = "/api/review/proof/proof-42/comments";

type Note = {
  id: string;
  parentId: string | null;
  body: string;
  authorName: string;
  authorRole: "shop" | "client";
  revisionLetter: string;
  createdAt: string;
  resolvedAt: string | null;
  side: string | null;
};
const note = (over: Partial<Note> & { id: string }): Note => ({
  parentId: null,
  body: "Can the crest sit a little higher?",
  authorName: "Tamsin Roe",
  authorRole: "client",
  revisionLetter: "A",
  createdAt: "2026-04-01T10:00:00.000Z",
  resolvedAt: null,
  side: "front",
  ...over,
});
const payload = (
  comments: Note[],
  extra: Partial<{
    revision: { letter: string; state: string } | null;
    approvals: Array<{ id: string; decision: string; fullName: string; revisionLetter: string; at: string }>;
  }> = {},
) => ({
  comments,
  revision: { letter: "A", state: "open" },
  approvals: [],
  ...extra,
});

function setup({
  comments = [note({ id: "n1" })],
  canReply = true,
  extra = {},
}: { comments?: Note[]; canReply?: boolean; extra?: Parameters<typeof payload>[1] } = {}) {
  let current = payload(comments, extra);
  const server = fakeFetch([
    { method: "GET", url: NOTES_URL, reply: () => ({ json: current }) },
    {
      method: "POST",
      url: NOTES_URL,
      reply: ({ body }) => {
        const { body: text, parentId } = body as { body: string; parentId: string };
        current = {
          ...current,
          comments: [
            ...current.comments,
            note({
              id: `r${current.comments.length}`,
              parentId,
              body: text,
              authorName: "Bramble Press",
              authorRole: "shop",
              side: null,
            }),
          ],
        };
        return { status: 201, json: current };
      },
    },
    {
      method: "PATCH",
      url: NOTES_URL,
      reply: ({ body }) => {
        const { commentId, resolved } = body as { commentId: string; resolved: boolean };
        current = {
          ...current,
          comments: current.comments.map((c) =>
            c.id === commentId ? { ...c, resolvedAt: resolved ? "2026-04-02T08:00:00.000Z" : null } : c,
          ),
        };
        return { json: current };
      },
    },
  ]);
  renderWithQuery(<ClientNotes proofId="proof-42" canReply={canReply} />);
  return { user: userEvent.setup(), server, region: screen.getByRole("region", { name: "Client notes" }) };
}

describe("ClientNotes", () => {
  it("loads the notes and numbers each thread with its author, revision and side", async () => {
    const { region } = setup({
      comments: [
        note({ id: "n1" }),
        note({ id: "n2", body: "Sleeve text reads backwards.", side: "back", revisionLetter: "B" }),
      ],
    });
    const items = await within(region).findAllByRole("listitem");
    expect(items).toHaveLength(2);
    expect(items[0]!.textContent).toContain("1Tamsin Roe rev. A · front");
    expect(items[1]!.textContent).toContain("2Tamsin Roe rev. B · back");
    expect(within(items[1]!).getByText("Sleeve text reads backwards.")).toBeTruthy();
  });

  it("shows markup typed by a client as text, never as elements", async () => {
    const { region } = setup({
      comments: [
        note({ id: "n1", body: TYPED_MARKUP, authorName: "<i>Tamsin</i>" }),
        note({ id: "n2", parentId: "n1", body: `Reply ${TYPED_MARKUP}`, authorName: "<u>Ned</u>" }),
      ],
    });
    const item = await within(region).findByRole("listitem");
    expect(item.textContent).toContain(TYPED_MARKUP);
    expect(item.textContent).toContain(`<u>Ned</u>: Reply ${TYPED_MARKUP}`);
    expect(item.textContent).toContain("<i>Tamsin</i>");
    expect(region.querySelectorAll("img, b, i, u, script")).toHaveLength(0);
  });

  it("says where the revision stands and who decided", async () => {
    setup({
      extra: {
        revision: { letter: "B", state: "approved" },
        approvals: [
          {
            id: "ap1",
            decision: "approved",
            fullName: "Tamsin Roe",
            revisionLetter: "B",
            at: "2026-04-03T14:30:00.000Z",
          },
        ],
      },
    });
    expect(await screen.findByText("Revision B is with the client and approved.")).toBeTruthy();
    expect(screen.getByText(/^Approved by Tamsin Roe · rev\. B · /)).toBeTruthy();
  });

  it("says when nothing has been shared yet", async () => {
    setup({ comments: [], extra: { revision: null } });
    await waitFor(() => expect(screen.getByText("Nothing shared yet.")).toBeTruthy());
    expect(screen.queryByRole("listitem")).toBeNull();
  });

  it("sends a reply on the thread, shows it as text and empties the box", async () => {
    const { user, server, region } = setup();
    const item = await within(region).findByRole("listitem");
    const box = within(item).getByRole("textbox", { name: "Reply to the client" });
    await user.type(box, "Moved up 1/2 in on <b>rev B</b>.");
    await user.click(within(item).getByRole("button", { name: "Reply" }));
    await waitFor(() => expect(within(item).getByText(/Moved up 1\/2 in on <b>rev B<\/b>\./)).toBeTruthy());
    expect(server.sent("POST")).toEqual([
      { url: NOTES_URL, method: "POST", body: { body: "Moved up 1/2 in on <b>rev B</b>.", parentId: "n1" } },
    ]);
    expect(item.querySelector("b")).toBeNull();
    expect(box).toHaveProperty("value", "");
  });

  it("sends nothing for an empty reply", async () => {
    const { user, server, region } = setup();
    const item = await within(region).findByRole("listitem");
    await user.type(within(item).getByRole("textbox", { name: "Reply to the client" }), "   ");
    await user.click(within(item).getByRole("button", { name: "Reply" }));
    expect(server.sent("POST")).toHaveLength(0);
  });

  it("keeps the typed reply and shows the reason when it is not saved", async () => {
    const server = fakeFetch([
      { method: "GET", url: NOTES_URL, reply: () => ({ json: payload([note({ id: "n1" })]) }) },
      {
        method: "POST",
        url: NOTES_URL,
        reply: () => ({
          status: 429,
          json: { error: "Too many notes at once. Wait a minute and try again." },
        }),
      },
    ]);
    renderWithQuery(<ClientNotes proofId="proof-42" canReply />);
    const user = userEvent.setup();
    const item = await screen.findByRole("listitem");
    const box = within(item).getByRole("textbox", { name: "Reply to the client" });
    await user.type(box, "On it.");
    await user.click(within(item).getByRole("button", { name: "Reply" }));
    expect(await screen.findByText("Too many notes at once. Wait a minute and try again.")).toBeTruthy();
    expect(box).toHaveProperty("value", "On it.");
    expect(server.sent("POST")).toHaveLength(1);
  });

  it("marks a thread resolved and reopens it", async () => {
    const { user, server, region } = setup();
    const item = await within(region).findByRole("listitem");
    await user.click(within(item).getByRole("button", { name: "Mark resolved" }));
    await within(item).findByRole("button", { name: "Reopen" });
    await user.click(within(item).getByRole("button", { name: "Reopen" }));
    await within(item).findByRole("button", { name: "Mark resolved" });
    expect(server.sent("PATCH").map((c) => c.body)).toEqual([
      { commentId: "n1", resolved: true },
      { commentId: "n1", resolved: false },
    ]);
  });

  it("offers no reply form to someone who may only read", async () => {
    const { region } = setup({ canReply: false });
    await within(region).findByRole("listitem");
    expect(within(region).queryByRole("textbox")).toBeNull();
    expect(within(region).queryByRole("button", { name: "Mark resolved" })).toBeNull();
  });
});
