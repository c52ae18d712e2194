import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it, vi } from "vitest";
import { ReviewView, type ReviewViewProps } from "@/components/review/ReviewView";
import { findBlank } from "@/lib/garments/catalog";
import { APPROVAL_STATEMENT } from "@/lib/review/approval";
import { fakeFetch, renderWithQuery, TYPED_MARKUP } from "./support";

// The garment drawing needs a real canvas; these tests are about the notes and the decision beside it.
vi.mock("@/components/editor/ProofCanvas", () => ({
  ProofCanvas: () => <div role="img" aria-label="Garment proof" />,
}));
vi.mock("@/components/editor/CalibrationDialog", () => ({ CalibrationDialog: () => null }));

const BASE = "/api/review/link/tok-9Rw4";
const tee = findBlank("everyday-crew-tee")!;

type Comment = ReviewViewProps["initial"]["comments"][number];
const comment = (over: Partial<Comment> & { id: string }): Comment => ({
  parentId: null,
  side: "front",
  xIn: 1,
  yIn: 6,
  body: "Please make the oar logo a touch smaller.",
  authorName: "Hollis Quarry",
  authorRole: "client",
  revisionLetter: "A",
  createdAt: "2026-05-10T09:00:00.000Z",
  resolvedAt: null,
  ...over,
});

function props(over: Partial<ReviewViewProps> = {}): ReviewViewProps {
  return {
    reviewKind: "link",
    reviewKey: "tok-9Rw4",
    shopName: "Bramble Press",
    clock: { locale: "en-US", timeZone: "America/Chicago" },
    jobTitle: "Regatta crew shirts",
    proofName: "Front and back",
    snapshot: {
      blankId: tee.id,
      blankName: tee.styleName,
      size: "M",
      colourName: "Deep Harbor",
      colourHex: "#243247",
      placements: [
        {
          id: "pl1",
          location: "full-front",
          artworkId: null,
          widthIn: 11,
          heightIn: 9,
          offsetFromCenterIn: 0,
          belowCollarIn: 3,
          rotationDeg: 0,
        },
      ],
    },
    colourHex: "#243247",
    blank: {
      category: tee.category,
      name: tee.styleName,
      sizeChart: tee.sizes.map((r) => ({ size: r.size, group: r.group, measurements: r.measurements })),
    },
    art: [],
    canComment: true,
    canApprove: true,
    viewerName: "Hollis Quarry",
    changes: null,
    initial: {
      comments: [comment({ id: "c1" })],
      revision: { letter: "A", state: "open", sentAt: "2026-05-09T12:00:00.000Z" },
      approvals: [],
    },
    signedIn: false,
    ...over,
  };
}

function setup(
  over: Partial<ReviewViewProps> = {},
  replies: {
    post?: (body: unknown) => { status?: number; json: unknown };
    decision?: (body: unknown) => { status?: number; json: unknown };
  } = {},
) {
  const p = props(over);
  let state = p.initial;
  const server = fakeFetch([
    { method: "GET", url: `${BASE}/comments`, reply: () => ({ json: state }) },
    {
      method: "POST",
      url: `${BASE}/comments`,
      reply: ({ body }) => {
        if (replies.post) return replies.post(body);
        const b = body as { body: string; parentId?: string };
        state = {
          ...state,
          comments: [
            ...state.comments,
            comment({
              id: `c${state.comments.length + 1}`,
              parentId: b.parentId ?? null,
              body: b.body,
              authorName: "Hollis Quarry",
            }),
          ],
        };
        return { status: 201, json: state };
      },
    },
    {
      method: "POST",
      url: `${BASE}/decision`,
      reply: ({ body }) => (replies.decision ? replies.decision(body) : { status: 201, json: { ok: true } }),
    },
  ]);
  renderWithQuery(<ReviewView {...p} />);
  return { user: userEvent.setup(), server, notes: screen.getByRole("region", { name: "Notes" }) };
}

describe("ReviewView notes", () => {
  it("shows markup in notes, replies and names as text, never as elements", () => {
    const { notes } = setup({
      initial: {
        comments: [
          comment({ id: "c1", body: TYPED_MARKUP, authorName: "<em>Hollis</em>" }),
          comment({
            id: "c2",
            parentId: "c1",
            body: `and ${TYPED_MARKUP}`,
            authorName: "Bramble Press",
            authorRole: "shop",
          }),
        ],
        revision: { letter: "A", state: "open", sentAt: "2026-05-09T12:00:00.000Z" },
        approvals: [],
      },
    });
    const item = within(notes).getByRole("listitem");
    expect(item.textContent).toContain(TYPED_MARKUP);
    expect(item.textContent).toContain("<em>Hollis</em>");
    expect(item.textContent).toContain(`Bramble Press · print shop: and ${TYPED_MARKUP}`);
    expect(notes.querySelectorAll("img, b, em, script")).toHaveLength(0);
  });

  it("says so when there are no notes", () => {
    const { notes } = setup({
      initial: {
        comments: [],
        revision: { letter: "A", state: "open", sentAt: "2026-05-09T12:00:00.000Z" },
        approvals: [],
      },
    });
    expect(within(notes).getByText("No notes yet.")).toBeTruthy();
  });

  it("sends a reply to the thread and shows it as text", async () => {
    const { user, server, notes } = setup();
    const item = within(notes).getByRole("listitem");
    const box = within(item).getByRole("textbox", { name: "Reply" });
    await user.type(box, "Smaller is fine <3");
    await user.click(within(item).getByRole("button", { name: "Send" }));
    await waitFor(() => expect(within(item).getByText(/Smaller is fine <3/)).toBeTruthy());
    expect(server.sent("POST").map((c) => c.body)).toEqual([{ body: "Smaller is fine <3", parentId: "c1" }]);
    expect(box).toHaveProperty("value", "");
  });

  it("keeps the reply and shows the reason when it is refused", async () => {
    const { user, notes } = setup(
      {},
      {
        post: () => ({
          status: 429,
          json: { error: "Too many notes from here. Wait a minute and try again." },
        }),
      },
    );
    const item = within(notes).getByRole("listitem");
    const box = within(item).getByRole("textbox", { name: "Reply" });
    await user.type(box, "One more thing");
    await user.click(within(item).getByRole("button", { name: "Send" }));
    expect(
      await within(item).findByText("Too many notes from here. Wait a minute and try again."),
    ).toBeTruthy();
    expect(box).toHaveProperty("value", "One more thing");
  });

  it("sends nothing for an empty reply", async () => {
    const { user, server, notes } = setup();
    const item = within(notes).getByRole("listitem");
    await user.click(within(item).getByRole("button", { name: "Send" }));
    expect(server.sent("POST")).toHaveLength(0);
  });

  it("offers no reply box once the revision is decided", () => {
    setup({
      initial: {
        comments: [comment({ id: "c1" })],
        revision: { letter: "A", state: "approved", sentAt: "2026-05-09T12:00:00.000Z" },
        approvals: [],
      },
    });
    expect(screen.queryByRole("textbox", { name: "Reply" })).toBeNull();
  });

  it("offers no reply box to a viewer who may only look", () => {
    setup({ canComment: false, canApprove: false });
    expect(screen.queryByRole("textbox", { name: "Reply" })).toBeNull();
    expect(screen.queryByRole("region", { name: "Decision" })).toBeNull();
  });
});

describe("ReviewView decision", () => {
  it("sends the approval with the typed name and the tick, and shows a refusal in words", async () => {
    const { user, server } = setup(
      { viewerName: null },
      {
        decision: (body) =>
          (body as { confirmed: boolean }).confirmed
            ? { status: 201, json: { ok: true } }
            : { status: 400, json: { error: "Tick the box to approve." } },
      },
    );
    const decision = screen.getByRole("region", { name: "Decision" });
    await user.type(within(decision).getByRole("textbox", { name: "Your full name" }), "Hollis Quarry");
    await user.click(within(decision).getByRole("button", { name: "Approve revision A" }));
    expect((await within(decision).findByRole("alert")).textContent).toBe("Tick the box to approve.");
    await user.click(within(decision).getByRole("checkbox", { name: APPROVAL_STATEMENT }));
    await user.click(within(decision).getByRole("button", { name: "Approve revision A" }));
    await waitFor(() => expect(within(decision).queryByRole("alert")).toBeNull());
    expect(
      server
        .sent("POST")
        .filter((c) => c.url.endsWith("/decision"))
        .map((c) => c.body),
    ).toEqual([
      { decision: "approved", letter: "A", fullName: "Hollis Quarry", confirmed: false },
      { decision: "approved", letter: "A", fullName: "Hollis Quarry", confirmed: true },
    ]);
  });

  it("asks for changes with a comment", async () => {
    const { user, server } = setup();
    const decision = screen.getByRole("region", { name: "Decision" });
    await user.click(within(decision).getByRole("tab", { name: "Ask for changes" }));
    await user.type(
      within(decision).getByRole("textbox", { name: "What should change?" }),
      "Use the gold ink.",
    );
    await user.click(within(decision).getByRole("button", { name: "Send the change request" }));
    await waitFor(() => expect(server.sent("POST")).toHaveLength(1));
    expect(server.sent("POST")[0]!.body).toEqual({
      decision: "changes-requested",
      letter: "A",
      fullName: "Hollis Quarry",
      comment: "Use the gold ink.",
    });
  });
});
