"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useId, useMemo, useRef, useState, type RefObject } from "react";
import { useCalibration } from "@/components/editor/calibration";
import { CalibrationDialog } from "@/components/editor/CalibrationDialog";
import { ProofCanvas, type ArtSource } from "@/components/editor/ProofCanvas";
import { useHydrated } from "@/components/orders/useHydrated";
import { LOCATION_LABELS, sideOf } from "@/lib/garments/locations";
import { buildSilhouette } from "@/lib/garments/silhouette";
import type { GarmentCategory, GarmentMeasurements, GarmentSide, Point, Rect, SizeGroup } from "@/lib/garments/types";
import { placementCenter } from "@/lib/placement/model";
import { svgDataUrl } from "@/lib/demo-art";
import { APPROVAL_STATEMENT } from "@/lib/review/approval";
import type { RevisionSnapshot } from "@/lib/review/diff";
import { PinMover } from "./PinMover";
import { formatLength, type LengthUnit } from "@/lib/units";
import { formatShopDateTime, type ShopClock } from "@/lib/dates";

type Comment = {
  id: string;
  parentId: string | null;
  side: GarmentSide | null;
  xIn: number | null;
  yIn: number | null;
  body: string;
  authorName: string;
  authorRole: "shop" | "client";
  revisionLetter: string;
  createdAt: string;
  resolvedAt: string | null;
};
type ReviewState = {
  comments: Comment[];
  revision: { letter: string; state: "open" | "approved" | "changes-requested"; sentAt: string } | null;
  approvals: Array<{ id: string; decision: "approved" | "changes-requested"; fullName: string; revisionLetter: string; at: string }>;
};

export type ReviewViewProps = {
  reviewKind: "link" | "proof";
  reviewKey: string;
  shopName: string;
  /** The shop's locale and time zone: dates read as the shop writes them. */
  clock: ShopClock;
  jobTitle: string;
  proofName: string;
  snapshot: RevisionSnapshot;
  colourHex: string;
  blank: { category: GarmentCategory; name: string; sizeChart: Array<{ size: string; group: SizeGroup; measurements: GarmentMeasurements }> };
  art: Array<{ id: string; name: string; kind: string; svg: string | null; inkWidthPx: number; inkHeightPx: number }>;
  canComment: boolean;
  canApprove: boolean;
  viewerName: string | null;
  changes: { since: string; lines: string[] } | null;
  initial: ReviewState;
  signedIn: boolean;
};

/**
 * A pin waiting for its note. `via` says how it was placed: a tap on the garment, or a spot picked
 * from the list (its name). `focus` is where the keyboard goes once the note form shows, and `seq`
 * changes with every placing, so placing again brings the form back into view.
 */
type DraftPin = { xIn: number; yIn: number; side: GarmentSide; via: string | null; focus: "note" | "pin"; seq: number };

const STATE_TEXT: Record<string, { text: string; tone: string }> = {
  open: { text: "Waiting for your decision", tone: "bg-ochre-100 text-ochre-800" },
  approved: { text: "Approved", tone: "bg-patina-100 text-patina-800" },
  "changes-requested": { text: "Changes asked for", tone: "bg-brick-100 text-brick-800" },
};

export function ReviewView(props: ReviewViewProps) {
  const base = `/api/review/${props.reviewKind}/${props.reviewKey}`;
  const client = useQueryClient();
  const query = useQuery<ReviewState>({
    queryKey: ["review", props.reviewKind, props.reviewKey],
    queryFn: async () => {
      const r = await fetch(`${base}/comments`, { cache: "no-store" });
      if (!r.ok) throw new Error(((await r.json().catch(() => ({}))) as { error?: string }).error ?? "Could not load notes.");
      return (await r.json()) as ReviewState;
    },
    initialData: props.initial,
    refetchInterval: 3_000,
  });
  const state = query.data;
  const revision = state.revision;
  const decided = revision && revision.state !== "open";
  const [side, setSide] = useState<GarmentSide>("front");
  const [size, setSize] = useState(props.snapshot.size);
  const [unit, setUnit] = useState<LengthUnit>("in");
  const [worn, setWorn] = useState(false);
  const [zoom, setZoom] = useState<number | null>(null);
  const [draftPin, setDraftPin] = useState<DraftPin | null>(null);
  const pinSeq = useRef(0);
  const chooserToggle = useRef<HTMLButtonElement>(null);
  const hydrated = useHydrated();
  const [activeNote, setActiveNote] = useState<string | null>(null);
  const calibration = useCalibration(props.signedIn);
  const [calibrating, setCalibrating] = useState(false);

  const row = props.blank.sizeChart.find((r) => r.size === size) ?? props.blank.sizeChart[0]!;
  const canPin = props.canComment && !decided;
  // Pins stay on the garment's flat outline (sleeves included), the box the canvas draws.
  const draftSide = draftPin?.side ?? side;
  const pinBounds: Rect = useMemo(() => {
    const outline = buildSilhouette(props.blank.category, row.measurements, draftSide).outline;
    const xs = outline.map((p) => p.x);
    const ys = outline.map((p) => p.y);
    return { x: Math.min(...xs), y: Math.min(...ys), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) };
  }, [props.blank.category, row.measurements, draftSide]);
  const pinSpots = useMemo(() => {
    const spots: Array<{ key: string; label: string; point: Point }> = props.snapshot.placements
      .filter((p) => sideOf(p.location) === side)
      .map((p) => {
        const artName = props.art.find((a) => a.id === p.artworkId)?.name;
        return { key: p.id, label: `${LOCATION_LABELS[p.location]}${artName ? ` (${artName})` : ""}`, point: placementCenter(p) };
      });
    // For a side with no print, or a note about the garment itself: the middle of the body.
    const hemY = buildSilhouette(props.blank.category, row.measurements, side).hemY;
    spots.push({ key: "middle", label: `Middle of the ${props.blank.category === "tote" ? "bag" : "garment"}`, point: { x: 0, y: hemY / 2 } });
    return spots;
  }, [props.snapshot.placements, props.art, props.blank.category, row.measurements, side]);

  function placePin(point: Point, via: string | null, focus: DraftPin["focus"]) {
    pinSeq.current += 1;
    setDraftPin({ xIn: point.x, yIn: point.y, side, via, focus, seq: pinSeq.current });
  }
  /** The form goes away; a keyboard user goes back to where they started. */
  function closeDraft() {
    const back = draftPin?.focus === "pin";
    setDraftPin(null);
    if (back) requestAnimationFrame(() => chooserToggle.current?.focus());
  }
  const art: ArtSource[] = useMemo(
    () =>
      props.art.map((a) => ({
        id: a.id,
        name: a.name,
        src: a.kind === "generated" && a.svg ? svgDataUrl(a.svg) : `${base}/art/${a.id}`,
        // The first picture on a phone: the small copy, a few kilobytes, while the canvas loads the full preview.
        posterSrc: a.kind === "generated" && a.svg ? undefined : `${base}/art/${a.id}?size=small`,
        inkWidthPx: a.inkWidthPx,
        inkHeightPx: a.inkHeightPx,
      })),
    [props.art, base],
  );

  const threads = state.comments.filter((c) => !c.parentId);
  const pins = threads
    .map((c, i) => ({ c, n: i + 1 }))
    .filter(({ c }) => c.side === side && c.xIn !== null && c.yIn !== null)
    .map(({ c, n }) => ({ id: c.id, n, xIn: c.xIn!, yIn: c.yIn!, resolved: !!c.resolvedAt, active: c.id === activeNote }));
  if (draftPin && draftPin.side === side) pins.push({ id: "draft", n: threads.length + 1, xIn: draftPin.xIn, yIn: draftPin.yIn, resolved: false, active: true });

  const post = useMutation({
    mutationFn: async (body: Record<string, unknown>) => {
      const r = await fetch(`${base}/comments`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
      const json = (await r.json().catch(() => ({}))) as ReviewState & { error?: string };
      if (!r.ok) throw new Error(json.error ?? "The note was not saved.");
      return json;
    },
    onSuccess: (data) => client.setQueryData(["review", props.reviewKind, props.reviewKey], { comments: data.comments, revision: data.revision, approvals: data.approvals }),
  });

  const latestApproval = state.approvals.find((a) => a.revisionLetter === revision?.letter);

  function downloadMockup(multiplier: number) {
    const konva = (window as unknown as { Konva?: { stages: Array<{ width(): number; find(selector: string): Array<{ visible(v?: boolean): boolean }>; toDataURL(o: { pixelRatio: number; mimeType: string }): string }> } }).Konva;
    const stage = konva?.stages[konva.stages.length - 1];
    if (!stage) return;
    const rulers = stage.find(".rulers");
    rulers.forEach((r) => r.visible(false));
    const url = stage.toDataURL({ pixelRatio: multiplier, mimeType: "image/png" });
    rulers.forEach((r) => r.visible(true));
    const a = document.createElement("a");
    a.href = url;
    a.download = `${props.jobTitle.replace(/[^a-z0-9]+/gi, "-").toLowerCase()}-rev-${revision?.letter ?? "A"}-${side}.png`;
    a.click();
  }

  return (
    <div className="mx-auto max-w-6xl" data-testid="review" data-hydrated={hydrated}>
      <header className="mb-4">
        <p className="text-sm text-ink-500">{props.shopName}</p>
        <h1 className="text-2xl">{props.jobTitle}</h1>
        <div className="mt-2 flex flex-wrap items-center gap-2 text-sm">
          <span className="text-ink-700">
            {props.proofName} · {props.blank.name} in {props.snapshot.colourName}
          </span>
          {revision ? (
            <>
              <span className="measure rounded-full bg-paper-200 px-2 py-0.5 text-xs">Revision {revision.letter}</span>
              <span className={`rounded-full px-2 py-0.5 text-xs font-medium ${STATE_TEXT[revision.state]!.tone}`} data-testid="revision-state">
                {STATE_TEXT[revision.state]!.text}
              </span>
            </>
          ) : null}
        </div>
      </header>

      {props.changes && props.changes.lines.length ? (
        <section className="mb-4 rounded-card border border-ochre-300 bg-ochre-100 p-4 text-sm text-ochre-800" aria-label="What changed">
          <h2 className="font-semibold">What changed since revision {props.changes.since}</h2>
          <ul className="mt-1 list-disc pl-5">
            {props.changes.lines.map((l) => (
              <li key={l}>{l}</li>
            ))}
          </ul>
        </section>
      ) : null}

      <div className="grid gap-4 lg:grid-cols-[1fr_22rem]">
        <div className="card overflow-hidden">
          <div className="flex flex-wrap items-center gap-2 border-b border-paper-200 p-2 text-sm">
            <div className="flex rounded-lg border border-paper-300 p-0.5" role="group" aria-label="Garment side">
              {(["front", "back"] as const).map((s) => (
                <button key={s} type="button" aria-pressed={side === s} onClick={() => setSide(s)} className={`rounded-md px-3 py-1 capitalize ${side === s ? "bg-ink-800 text-chalk" : "text-ink-700"}`}>
                  {s}
                </button>
              ))}
            </div>
            <label className="flex items-center gap-1">
              <span className="sr-only">Size</span>
              <select className="field-input py-1 text-sm" value={size} onChange={(e) => setSize(e.target.value)} aria-label="Size">
                {props.blank.sizeChart.map((r) => (
                  <option key={r.size} value={r.size}>
                    Size {r.size}
                  </option>
                ))}
              </select>
            </label>
            <button type="button" aria-pressed={worn} className={`rounded-lg border px-3 py-1 ${worn ? "border-patina-400 bg-patina-100 text-patina-800" : "border-paper-300"}`} onClick={() => { setWorn((w) => !w); setZoom(null); }}>
              On a person
            </button>
            <button type="button" aria-pressed={zoom === 1} className={`rounded-lg border px-3 py-1 ${zoom === 1 ? "border-patina-400 bg-patina-100 text-patina-800" : "border-paper-300"}`} onClick={() => setZoom(zoom === 1 ? null : 1)}>
              Actual size
            </button>
            <div className="flex rounded-lg border border-paper-300 p-0.5" role="group" aria-label="Units">
              {(["in", "cm"] as const).map((u) => (
                <button key={u} type="button" aria-pressed={unit === u} onClick={() => setUnit(u)} className={`rounded-md px-2 py-1 ${unit === u ? "bg-ink-800 text-chalk" : "text-ink-700"}`}>
                  {u}
                </button>
              ))}
            </div>
          </div>
          {zoom === 1 ? (
            <p className="border-b border-paper-200 bg-paper-100 px-3 py-1.5 text-xs text-ink-600">
              {calibration.calibrated ? "Actual size on this screen." : "Actual size assumes 96 px per inch, which may not match this screen."}{" "}
              <button type="button" className="font-medium text-patina-700 underline" onClick={() => setCalibrating(true)}>
                Match a card to the screen
              </button>
            </p>
          ) : null}
          <div className="h-[62vh] min-h-[22rem]" data-testid="review-canvas">
            <ProofCanvas
              category={props.blank.category}
              group={row.group}
              measurements={row.measurements}
              side={side}
              colourHex={props.colourHex}
              placements={props.snapshot.placements}
              art={art}
              selectedId={null}
              unit={unit}
              zoom={zoom}
              pxPerInch={calibration.pxPerInch}
              editable={false}
              keepAspect
              onZoomChange={setZoom}
              onSelect={() => undefined}
              onCommit={() => undefined}
              callouts
              worn={worn}
              pins={pins}
              onGarmentClick={canPin ? (p) => placePin(p, null, "note") : undefined}
            />
          </div>
          <div className="flex flex-wrap items-center justify-between gap-2 border-t border-paper-200 p-2 text-xs text-ink-500">
            <span>{canPin ? "Tap the garment to pin a note to that spot." : "Sizes are the print's real size."}</span>
            <span className="flex gap-1">
              Mock-up PNG:
              {[1, 2, 3].map((m) => (
                <button key={m} type="button" className="font-medium text-patina-700 underline" onClick={() => downloadMockup(m * 2)}>
                  {m === 1 ? "standard" : m === 2 ? "large" : "print"}
                </button>
              ))}
            </span>
          </div>
          {canPin ? <PinChooser side={side} spots={pinSpots} toggle={chooserToggle} onChoose={(spot) => placePin(spot.point, spot.label, "pin")} /> : null}
        </div>

        <aside className="space-y-4">
          {draftPin ? (
            <NoteComposer
              title={`Note ${threads.length + 1}: ${draftPin.via ? `pinned on the ${draftPin.via.charAt(0).toLowerCase()}${draftPin.via.slice(1)}` : "pinned where you tapped"}${draftPin.side !== side ? ` (${draftPin.side})` : ""}`}
              askName={props.reviewKind === "link" && !props.viewerName}
              busy={post.isPending}
              error={post.error?.message ?? null}
              pin={{ x: draftPin.xIn, y: draftPin.yIn }}
              unit={unit}
              tote={props.blank.category === "tote"}
              bounds={pinBounds}
              focusRequest={{ seq: draftPin.seq, target: draftPin.focus }}
              onMove={(p) => setDraftPin((d) => (d ? { ...d, xIn: p.x, yIn: p.y } : d))}
              onCancel={closeDraft}
              onSubmit={async (body, authorName) => {
                await post.mutateAsync({ body, side: draftPin.side, xIn: draftPin.xIn, yIn: draftPin.yIn, authorName });
                closeDraft();
              }}
            />
          ) : null}

          <section className="card p-4" aria-label="Print sizes">
            <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-500">Prints</h2>
            <ul className="mt-2 space-y-2 text-sm">
              {props.snapshot.placements.map((p) => (
                <li key={p.id}>
                  <span className="font-medium">{LOCATION_LABELS[p.location]}</span> <span className="text-ink-500">({sideOf(p.location)})</span>
                  <span className="measure block text-ink-700">
                    {formatLength(p.widthIn, unit)} × {formatLength(p.heightIn, unit)}, {formatLength(p.belowCollarIn, unit)} below the collar
                    {Math.abs(p.offsetFromCenterIn) >= 1 / 16 ? `, ${formatLength(Math.abs(p.offsetFromCenterIn), unit)} from center` : ", centered"}
                  </span>
                </li>
              ))}
            </ul>
          </section>

          <section className="card p-4" aria-label="Notes">
            <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-500">Notes</h2>
            {threads.length === 0 ? <p className="mt-2 text-sm text-ink-500">No notes yet.</p> : null}
            <ol className="mt-2 space-y-3">
              {threads.map((c, i) => (
                <li key={c.id} className={`rounded-lg border p-3 text-sm ${c.resolvedAt ? "border-paper-200 opacity-70" : "border-paper-300"}`} data-testid="note">
                  <button type="button" className="text-left" onClick={() => { setActiveNote(c.id); if (c.side) setSide(c.side); }}>
                    <span className="mr-2 inline-grid h-5 w-5 place-items-center rounded-full bg-brick-600 text-xs font-bold text-chalk">{i + 1}</span>
                    <span className="font-medium">{c.authorName}</span> <span className="text-xs text-ink-500">rev. {c.revisionLetter}{c.resolvedAt ? " · resolved" : ""}</span>
                  </button>
                  <p className="mt-1 whitespace-pre-wrap break-words text-ink-800">{c.body}</p>
                  {state.comments
                    .filter((r) => r.parentId === c.id)
                    .map((r) => (
                      <p key={r.id} className="mt-2 whitespace-pre-wrap break-words border-l-2 border-patina-300 pl-2 text-ink-700" data-testid="reply">
                        <span className="font-medium">{r.authorName}</span>
                        {r.authorRole === "shop" ? <span className="text-xs text-ink-500"> · print shop</span> : null}: {r.body}
                      </p>
                    ))}
                  {props.canComment && !decided ? <ReplyBox onSend={(body) => post.mutateAsync({ body, parentId: c.id })} /> : null}
                </li>
              ))}
            </ol>
          </section>

          {revision && props.canApprove ? (
            <DecisionPanel
              base={base}
              letter={revision.letter}
              decided={!!decided}
              approval={latestApproval ?? null}
              defaultName={props.viewerName ?? ""}
              clock={props.clock}
              onDone={() => client.invalidateQueries({ queryKey: ["review", props.reviewKind, props.reviewKey] })}
            />
          ) : revision && decided && latestApproval ? (
            <p className="card p-4 text-sm">
              {latestApproval.decision === "approved" ? "Approved" : "Changes asked for"} by {latestApproval.fullName} on {formatShopDateTime(new Date(latestApproval.at), props.clock)}.
            </p>
          ) : null}
        </aside>
      </div>
      <CalibrationDialog open={calibrating} current={calibration.pxPerInch} onClose={() => setCalibrating(false)} onSave={calibration.save} saving={calibration.saving} error={calibration.error} />
    </div>
  );
}

/**
 * Pin a note without tapping: lists the prints on the side shown (and the middle of the garment),
 * and drops the pin at the middle of the one chosen.
 */
function PinChooser(props: {
  side: GarmentSide;
  spots: Array<{ key: string; label: string; point: Point }>;
  onChoose: (spot: { label: string; point: Point }) => void;
  toggle: RefObject<HTMLButtonElement | null>;
}) {
  const [open, setOpen] = useState(false);
  const listId = useId();
  const { toggle } = props;
  const close = () => {
    setOpen(false);
    toggle.current?.focus();
  };
  return (
    <div
      className="border-t border-paper-200 p-2 text-sm"
      onKeyDown={(e) => {
        if (e.key === "Escape" && open) {
          e.preventDefault();
          close();
        }
      }}
    >
      <button ref={toggle} type="button" className="btn-quiet px-3 py-1.5" aria-expanded={open} aria-controls={listId} onClick={() => setOpen((o) => !o)}>
        Choose a spot for a note
      </button>
      {open ? (
        <ul id={listId} className="mt-2 flex flex-wrap gap-2" aria-label={`Spots on the ${props.side} to pin a note on`}>
          {props.spots.map((spot) => (
            <li key={spot.key}>
              <button
                type="button"
                className="rounded-lg border border-paper-300 bg-chalk px-3 py-1.5 text-left text-ink-800 hover:bg-paper-200"
                onClick={() => {
                  setOpen(false);
                  props.onChoose(spot);
                }}
              >
                {spot.label}
              </button>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

function NoteComposer(props: {
  title: string;
  askName: boolean;
  busy: boolean;
  error: string | null;
  pin: Point;
  unit: LengthUnit;
  tote: boolean;
  bounds: Rect;
  focusRequest: { seq: number; target: "note" | "pin" };
  onMove: (pin: Point) => void;
  onCancel: () => void;
  onSubmit: (body: string, authorName?: string) => Promise<void>;
}) {
  const [body, setBody] = useState("");
  const [name, setName] = useState("");
  const form = useRef<HTMLFormElement>(null);
  const note = useRef<HTMLTextAreaElement>(null);
  const pad = useRef<HTMLDivElement>(null);
  const { seq, target } = props.focusRequest;
  // Each new pin brings the form to where the thumb is: in view, with the keyboard in the note
  // (after a tap) or on the pin (after picking a print, so the arrow keys move it).
  useEffect(() => {
    const field = target === "pin" ? pad.current : note.current;
    field?.focus({ preventScroll: true });
    const still = window.matchMedia?.("(prefers-reduced-motion: reduce)").matches ?? true;
    form.current?.scrollIntoView?.({ block: "nearest", behavior: still ? "auto" : "smooth" });
  }, [seq, target]);
  return (
    <form
      ref={form}
      className="card scroll-mb-4 scroll-mt-20 space-y-2 border-ochre-300 p-4"
      onSubmit={async (e) => {
        e.preventDefault();
        await props.onSubmit(body, props.askName ? name || undefined : undefined).catch(() => undefined);
      }}
      aria-label="New note"
      data-testid="note-composer"
    >
      <h2 className="text-sm font-semibold">{props.title}</h2>
      <PinMover pin={props.pin} unit={props.unit} tote={props.tote} bounds={props.bounds} onMove={props.onMove} ref={pad} />
      <textarea ref={note} className="field-input min-h-20 text-sm" value={body} onChange={(e) => setBody(e.target.value)} aria-label="Note" maxLength={2000} placeholder="What should change here?" />
      {props.askName ? (
        <input className="field-input py-1.5 text-sm" placeholder="Your name" value={name} onChange={(e) => setName(e.target.value)} aria-label="Your name" maxLength={80} autoComplete="name" />
      ) : null}
      {props.error ? <p className="field-error">{props.error}</p> : null}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary px-3 py-1.5" disabled={props.busy || !body.trim()}>
          {props.busy ? "Saving…" : "Pin note"}
        </button>
        <button type="button" className="btn-quiet px-3 py-1.5" onClick={props.onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}

function ReplyBox({ onSend }: { onSend: (body: string) => Promise<unknown> }) {
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  return (
    <form
      className="mt-2 flex gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        if (!body.trim()) return;
        try {
          await onSend(body);
          setBody("");
          setError(null);
        } catch (err) {
          setError(err instanceof Error ? err.message : "Not sent.");
        }
      }}
    >
      <input className="field-input py-1 text-sm" value={body} onChange={(e) => setBody(e.target.value)} placeholder="Reply" aria-label="Reply" maxLength={2000} />
      <button type="submit" className="btn-quiet px-2.5 py-1 text-xs">
        Send
      </button>
      {error ? <p className="field-error">{error}</p> : null}
    </form>
  );
}

function DecisionPanel(props: { base: string; letter: string; decided: boolean; approval: { decision: string; fullName: string; at: string } | null; defaultName: string; clock: ShopClock; onDone: () => void }) {
  const [mode, setMode] = useState<"approve" | "changes">("approve");
  const [name, setName] = useState(props.defaultName);
  const [confirmed, setConfirmed] = useState(false);
  const [comment, setComment] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (props.decided && props.approval) {
    return (
      <section className="card border-patina-300 p-4 text-sm" aria-label="Decision" data-testid="decision-done">
        <h2 className="font-semibold">{props.approval.decision === "approved" ? `Revision ${props.letter} approved` : "Changes asked for"}</h2>
        <p className="mt-1 text-ink-700">
          By {props.approval.fullName}, {formatShopDateTime(new Date(props.approval.at), props.clock)}. {props.approval.decision === "approved" ? "The print shop has been told. This revision is locked." : "The print shop will send a new revision."}
        </p>
      </section>
    );
  }
  async function submit() {
    setBusy(true);
    setError(null);
    const body = mode === "approve" ? { decision: "approved", letter: props.letter, fullName: name, confirmed } : { decision: "changes-requested", letter: props.letter, fullName: name, comment };
    const r = await fetch(`${props.base}/decision`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }).catch(() => null);
    setBusy(false);
    if (!r) return setError("No connection. Nothing was sent; try again.");
    const json = (await r.json().catch(() => ({}))) as { error?: string };
    if (!r.ok) return setError(json.error ?? "That did not go through.");
    props.onDone();
  }
  return (
    <section className="card space-y-3 p-4" aria-label="Decision">
      <div className="grid grid-cols-2 gap-1 rounded-lg bg-paper-200 p-1 text-sm" role="tablist" aria-label="Your decision">
        {(
          [
            ["approve", "Approve"],
            ["changes", "Ask for changes"],
          ] as const
        ).map(([k, label]) => (
          <button key={k} type="button" role="tab" aria-selected={mode === k} onClick={() => setMode(k)} className={`rounded-md px-2 py-1.5 font-medium ${mode === k ? "bg-chalk shadow-card" : "text-ink-600"}`}>
            {label}
          </button>
        ))}
      </div>
      <div>
        <label htmlFor="decision-name" className="field-label">
          Your full name
        </label>
        <input id="decision-name" className="field-input" value={name} onChange={(e) => setName(e.target.value)} autoComplete="name" />
      </div>
      {mode === "approve" ? (
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-1 accent-patina-600" checked={confirmed} onChange={(e) => setConfirmed(e.target.checked)} />
          <span>{APPROVAL_STATEMENT}</span>
        </label>
      ) : (
        <div>
          <label htmlFor="decision-comment" className="field-label">
            What should change?
          </label>
          <textarea id="decision-comment" className="field-input min-h-20" value={comment} onChange={(e) => setComment(e.target.value)} maxLength={2000} />
        </div>
      )}
      {error ? (
        <p role="alert" className="field-error">
          {error}
        </p>
      ) : null}
      <button type="button" className={mode === "approve" ? "btn-primary w-full" : "btn-danger w-full"} disabled={busy} onClick={submit}>
        {busy ? "Sending…" : mode === "approve" ? `Approve revision ${props.letter}` : "Send the change request"}
      </button>
    </section>
  );
}
