import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it, vi } from "vitest";
import type { ShareLinkView } from "@/app/shops/[shop]/proofs/[proofId]/share-actions";
import { SharePanel } from "@/components/editor/SharePanel";

const actions = vi.hoisted(() => ({
  shareProofAction: vi.fn(),
  listShareLinksAction: vi.fn(),
  revokeShareLinkAction: vi.fn(),
}));
vi.mock("@/app/shops/[shop]/proofs/[proofId]/share-actions", () => actions);

const LINK = "https://proofs.example.test/r/tok-7Hq2";
const shared = (
  data: Partial<{
    url: string;
    letter: string;
    emailed: boolean | null;
    changes: { since: string; lines: string[] } | null;
  }> = {},
) => ({
  ok: true as const,
  data: { url: LINK, letter: "B", emailed: null, changes: null, ...data },
});
const linkRow = (over: Partial<ShareLinkView> = {}): ShareLinkView => ({
  id: "link-1",
  permission: "comment",
  recipientEmail: "juniper@fernhill-rowing.example",
  recipientName: "Juniper Alcott",
  expiresAt: null,
  revokedAt: null,
  createdAt: "2026-03-02T15:00:00.000Z",
  lastSeenLetter: null,
  ...over,
});

beforeEach(() => {
  actions.shareProofAction.mockReset().mockResolvedValue(shared());
  actions.listShareLinksAction.mockReset().mockResolvedValue({ ok: true, data: [] });
  actions.revokeShareLinkAction.mockReset().mockResolvedValue({ ok: true, data: null });
});

function setup(props: { defaultEmail?: string | null; defaultName?: string | null } = {}) {
  const user = userEvent.setup();
  const onClose = vi.fn();
  render(
    <SharePanel
      open
      onClose={onClose}
      shopSlug="bramble-press"
      proofId="proof-42"
      defaultEmail={props.defaultEmail ?? null}
      defaultName={props.defaultName ?? null}
    />,
  );
  const dialog = screen.getByRole("dialog", { name: "Share with the client" });
  return { user, onClose, dialog };
}

describe("SharePanel", () => {
  it("opens as a dialog named for what it does and loads this proof's links", async () => {
    setup({ defaultEmail: "juniper@fernhill-rowing.example", defaultName: "Juniper Alcott" });
    await waitFor(() =>
      expect(actions.listShareLinksAction).toHaveBeenCalledWith({
        shopSlug: "bramble-press",
        proofId: "proof-42",
      }),
    );
    expect(screen.getByRole("textbox", { name: "Client e-mail" })).toHaveProperty(
      "value",
      "juniper@fernhill-rowing.example",
    );
    expect(screen.getByRole("textbox", { name: "Their name" })).toHaveProperty("value", "Juniper Alcott");
  });

  it("offers the three permissions and sends the one picked", async () => {
    const { user } = setup();
    const permission = screen.getByRole("combobox", { name: "They may" });
    const options = within(permission)
      .getAllByRole("option")
      .map((o) => o.textContent);
    expect(options).toEqual(["Look only", "Look and leave notes", "Notes and approval"]);
    expect(permission).toHaveProperty("value", "approve");
    await user.selectOptions(permission, "Look only");
    await user.selectOptions(screen.getByRole("combobox", { name: "Link works for" }), "No end date");
    await user.click(screen.getByRole("button", { name: "Make a link to copy" }));
    await waitFor(() => expect(actions.shareProofAction).toHaveBeenCalledTimes(1));
    expect(actions.shareProofAction).toHaveBeenCalledWith({
      shopSlug: "bramble-press",
      proofId: "proof-42",
      permission: "view",
      expiresInDays: null,
      recipientEmail: null,
      recipientName: null,
      message: null,
    });
  });

  it("cannot send by e-mail until an address is typed", async () => {
    const { user } = setup();
    const send = screen.getByRole("button", { name: "Send by e-mail" });
    expect(send).toHaveProperty("disabled", true);
    await user.type(screen.getByRole("textbox", { name: "Client e-mail" }), "   ");
    expect(send).toHaveProperty("disabled", true);
    await user.type(screen.getByRole("textbox", { name: "Client e-mail" }), "oren@quillfield.example");
    expect(send).toHaveProperty("disabled", false);
  });

  it("shows the refusal of a bad e-mail address in words, on the e-mail field, and no link", async () => {
    actions.shareProofAction.mockResolvedValue({
      ok: false,
      error: "Enter a valid e-mail address.",
      fieldErrors: { recipientEmail: ["Enter a valid e-mail address."] },
    });
    const { user } = setup();
    const email = screen.getByRole("textbox", { name: "Client e-mail" });
    await user.type(email, "oren at quillfield");
    await user.click(screen.getByRole("button", { name: "Send by e-mail" }));
    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toBe("Enter a valid e-mail address.");
    expect(actions.shareProofAction.mock.calls[0]![0]).toMatchObject({
      recipientEmail: "oren at quillfield",
    });
    expect(email.getAttribute("aria-invalid")).toBe("true");
    expect(document.getElementById(email.getAttribute("aria-describedby") ?? "")?.textContent).toBe(
      "Enter a valid e-mail address.",
    );
    expect(screen.queryByRole("textbox", { name: "Review link" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Copy" })).toBeNull();

    // Fixing the address and sending again clears the refusal.
    actions.shareProofAction.mockResolvedValue(shared({ emailed: true }));
    await user.clear(email);
    await user.type(email, "oren@quillfield.example");
    await user.click(screen.getByRole("button", { name: "Send by e-mail" }));
    await screen.findByRole("status");
    expect(screen.queryByRole("alert")).toBeNull();
    expect(email.getAttribute("aria-invalid")).toBeNull();
  });

  it("e-mails the link with the name and message, trimmed, and says it is on its way", async () => {
    actions.shareProofAction.mockResolvedValue(shared({ emailed: true }));
    const { user } = setup();
    await user.type(screen.getByRole("textbox", { name: "Client e-mail" }), "  oren@quillfield.example ");
    await user.type(screen.getByRole("textbox", { name: "Their name" }), "Oren Vale");
    await user.type(
      screen.getByRole("textbox", { name: "Message (optional)" }),
      "Back print moved up an inch.",
    );
    await user.selectOptions(screen.getByRole("combobox", { name: "Link works for" }), "7 days");
    await user.click(screen.getByRole("button", { name: "Send by e-mail" }));
    const status = await screen.findByRole("status");
    expect(status.textContent).toContain("Revision B is shared.");
    expect(status.textContent).toContain("The e-mail is on its way.");
    expect(actions.shareProofAction).toHaveBeenCalledWith(
      expect.objectContaining({
        permission: "approve",
        expiresInDays: 7,
        recipientEmail: "oren@quillfield.example",
        recipientName: "Oren Vale",
        message: "Back print moved up an inch.",
      }),
    );
  });

  it("says so when the e-mail could not be sent, and still gives the link", async () => {
    actions.shareProofAction.mockResolvedValue(shared({ emailed: false }));
    const { user } = setup({ defaultEmail: "oren@quillfield.example" });
    await user.click(screen.getByRole("button", { name: "Send by e-mail" }));
    const status = await screen.findByRole("status");
    expect(status.textContent).toContain("The e-mail could not be sent; copy the link instead.");
    expect(within(status).getByRole("textbox", { name: "Review link" })).toHaveProperty("value", LINK);
  });

  it("gives a read-only link and a Copy button that puts the link on the clipboard", async () => {
    const { user } = setup();
    await user.click(screen.getByRole("button", { name: "Make a link to copy" }));
    const status = await screen.findByRole("status");
    const link = within(status).getByRole("textbox", { name: "Review link" });
    expect(link).toHaveProperty("value", LINK);
    expect(link).toHaveProperty("readOnly", true);
    await user.click(within(status).getByRole("button", { name: "Copy" }));
    expect(await navigator.clipboard.readText()).toBe(LINK);
    // It confirms itself on the button and in words a screen reader announces.
    expect(within(status).getByRole("button", { name: "Copied" })).toBeTruthy();
    expect(screen.getByTestId("copy-said").textContent).toBe("Review link copied.");
    expect(screen.getByTestId("copy-said").getAttribute("aria-live")).toBe("polite");
  });

  it("lists what changed since the revision before", async () => {
    actions.shareProofAction.mockResolvedValue(
      shared({
        letter: "C",
        changes: { since: "B", lines: ["Full front: 11 in wide (was 12 in)", "Left sleeve print added"] },
      }),
    );
    const { user } = setup();
    await user.click(screen.getByRole("button", { name: "Make a link to copy" }));
    const status = await screen.findByRole("status");
    expect(within(status).getByText("Changed since revision B:")).toBeTruthy();
    expect(
      within(status)
        .getAllByRole("listitem")
        .map((li) => li.textContent),
    ).toEqual(["Full front: 11 in wide (was 12 in)", "Left sleeve print added"]);
  });

  it("shows a failure from the server and leaves the form as typed", async () => {
    actions.shareProofAction.mockResolvedValue({
      ok: false,
      error: "The link could not be made just now. Nothing was sent; try again.",
    });
    const { user } = setup();
    await user.type(screen.getByRole("textbox", { name: "Their name" }), "Oren Vale");
    await user.click(screen.getByRole("button", { name: "Make a link to copy" }));
    expect((await screen.findByRole("alert")).textContent).toBe(
      "The link could not be made just now. Nothing was sent; try again.",
    );
    expect(screen.getByRole("textbox", { name: "Their name" })).toHaveProperty("value", "Oren Vale");
    expect(screen.getByRole("button", { name: "Make a link to copy" })).toHaveProperty("disabled", false);
  });

  it("lists the proof's links and withdraws one", async () => {
    actions.listShareLinksAction
      .mockResolvedValueOnce({ ok: true, data: [linkRow({ lastSeenLetter: "A" })] })
      .mockResolvedValue({
        ok: true,
        data: [linkRow({ lastSeenLetter: "A", revokedAt: "2026-03-04T09:00:00.000Z" })],
      });
    const { user } = setup();
    const item = await screen.findByRole("listitem");
    expect(item.textContent).toContain("Juniper Alcott · Look and leave notes");
    expect(item.textContent).toContain("No end date · last opened at revision A");
    await user.click(within(item).getByRole("button", { name: "Withdraw" }));
    expect(actions.revokeShareLinkAction).toHaveBeenCalledWith({
      shopSlug: "bramble-press",
      linkId: "link-1",
    });
    await waitFor(() => expect(screen.getByRole("listitem").textContent).toContain("Withdrawn"));
    expect(screen.queryByRole("button", { name: "Withdraw" })).toBeNull();
  });

  it("closes from its Close button", async () => {
    const { user, onClose } = setup();
    await user.click(screen.getByRole("button", { name: "Close" }));
    expect(onClose).toHaveBeenCalledTimes(1);
  });
});
