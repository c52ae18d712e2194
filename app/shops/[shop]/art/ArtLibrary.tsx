"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { DropZone } from "@/components/artwork/DropZone";
import { EmptyState } from "@/components/ui/EmptyState";
import { SHAPE_LABELS, type ArtShape } from "@/lib/artwork/advice";
import { QUALITY_THRESHOLDS } from "@/lib/artwork/quality";
import { replaceArtworkAction } from "./actions";

export type LibraryArt = {
  id: string;
  name: string;
  kind: string;
  clientId: string | null;
  mime: string | null;
  bytes: number | null;
  isVector: boolean;
  inkWidthPx: number;
  inkHeightPx: number;
  widthPx: number | null;
  heightPx: number | null;
  densityPpi: number | null;
  shape: ArtShape | null;
  colourCount: number | null;
  continuousTone: boolean | null;
  notes: string[] | null;
  version: number;
  hasPreview: boolean;
  createdAt: string;
};

type Props = { shopSlug: string; canEdit: boolean; clients: Array<{ id: string; name: string }>; initialClientId: string | null; art: LibraryArt[] };

const IDEAL = QUALITY_THRESHOLDS.dtf.ideal;

export function ArtLibrary({ shopSlug, canEdit, clients, initialClientId, art }: Props) {
  const router = useRouter();
  const [clientId, setClientId] = useState<string | null>(initialClientId);
  const [replacing, setReplacing] = useState<string | null>(null);
  const [notice, setNotice] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const shown = useMemo(() => (clientId ? art.filter((a) => a.clientId === clientId || a.clientId === null) : art), [art, clientId]);
  const clientName = (id: string | null) => clients.find((c) => c.id === id)?.name ?? "Shop art";

  async function replace(oldId: string, newId: string) {
    const result = await replaceArtworkAction({ shopSlug, oldId, newId });
    setReplacing(null);
    setNotice(
      result.ok
        ? { tone: "ok", text: `New version in place: ${result.data.placements} placement${result.data.placements === 1 ? "" : "s"} kept their width on ${result.data.proofs} proof${result.data.proofs === 1 ? "" : "s"}; heights follow the new proportions.` }
        : { tone: "error", text: result.error },
    );
    router.refresh();
  }

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="client-filter" className="field-label">
            Client
          </label>
          <select id="client-filter" className="field-input py-1.5" value={clientId ?? ""} onChange={(e) => setClientId(e.target.value || null)}>
            <option value="">All clients</option>
            {clients.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </div>
        <p className="pb-2 text-sm text-ink-500">
          {clientId ? `New uploads are filed under ${clientName(clientId)}.` : "New uploads are filed as the shop's own art; pick a client to file them there."}
        </p>
      </div>

      {canEdit ? <DropZone shopSlug={shopSlug} clientId={clientId} onUploaded={() => router.refresh()} /> : null}

      {notice ? (
        <p role={notice.tone === "error" ? "alert" : "status"} className={`rounded-lg px-3 py-2 text-sm ${notice.tone === "ok" ? "bg-patina-100 text-patina-800" : "bg-brick-100 text-brick-800"}`}>
          {notice.text}
        </p>
      ) : null}

      {shown.length === 0 ? (
        <EmptyState title="No art yet">Drop the client&apos;s files above. Chalkline checks each one and keeps it for every proof.</EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3" aria-label="Artwork">
          {shown.map((a) => (
            <li key={a.id} className="card overflow-hidden" data-testid="art-card" data-name={a.name}>
              <div className="grid h-44 place-items-center bg-[repeating-conic-gradient(#ece6d9_0_25%,#f6f3ec_0_50%)] bg-[length:16px_16px] p-3">
                {/* eslint-disable-next-line @next/next/no-img-element */}
                <img src={`/api/artworks/${a.id}/thumbnail`} alt={`Thumbnail of ${a.name}`} className="max-h-full max-w-full object-contain" loading="lazy" />
              </div>
              <div className="space-y-2 p-4">
                <div className="flex items-baseline justify-between gap-2">
                  <h2 className="truncate text-base font-medium">{a.name}</h2>
                  <span className="shrink-0 text-xs text-ink-500">v{a.version}</span>
                </div>
                <p className="text-xs text-ink-500">{clientName(a.clientId)}</p>
                <dl className="measure grid grid-cols-2 gap-x-3 gap-y-1 text-xs text-ink-700">
                  <dt className="text-ink-500">Ink</dt>
                  <dd>
                    {a.inkWidthPx} × {a.inkHeightPx} px
                  </dd>
                  {a.widthPx && a.heightPx && (a.widthPx !== a.inkWidthPx || a.heightPx !== a.inkHeightPx) ? (
                    <>
                      <dt className="text-ink-500">Canvas</dt>
                      <dd>
                        {a.widthPx} × {a.heightPx} px
                      </dd>
                    </>
                  ) : null}
                  <dt className="text-ink-500">At {IDEAL} ppi</dt>
                  <dd>{a.isVector ? "any size (vector)" : `${(a.inkWidthPx / IDEAL).toFixed(2)} × ${(a.inkHeightPx / IDEAL).toFixed(2)} in`}</dd>
                  {a.densityPpi ? (
                    <>
                      <dt className="text-ink-500">File says</dt>
                      <dd>{Math.round(a.densityPpi)} ppi</dd>
                    </>
                  ) : null}
                  {a.colourCount ? (
                    <>
                      <dt className="text-ink-500">Colours</dt>
                      <dd>{a.continuousTone ? "full colour (photo-like)" : `about ${a.colourCount}`}</dd>
                    </>
                  ) : null}
                  {a.shape ? (
                    <>
                      <dt className="text-ink-500">Shape</dt>
                      <dd>{SHAPE_LABELS[a.shape]}</dd>
                    </>
                  ) : null}
                </dl>
                {a.notes?.length ? (
                  <ul className="space-y-1 text-xs text-ink-600">
                    {a.notes.map((n) => (
                      <li key={n}>{n}</li>
                    ))}
                  </ul>
                ) : null}
                {canEdit && a.kind === "upload" ? (
                  replacing === a.id ? (
                    <div className="pt-2">
                      <DropZone shopSlug={shopSlug} clientId={a.clientId} multiple={false} label="Drop the new version" onUploaded={(newId) => void replace(a.id, newId)} />
                      <button type="button" className="mt-2 text-xs text-ink-600 hover:underline" onClick={() => setReplacing(null)}>
                        Cancel
                      </button>
                    </div>
                  ) : (
                    <button type="button" className="text-sm font-medium text-patina-700 hover:underline" onClick={() => setReplacing(a.id)}>
                      Upload a new version
                    </button>
                  )
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
