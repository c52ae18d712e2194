"use client";

import { useCallback, useRef, useState, type DragEvent } from "react";

const ACCEPT = ["image/png", "image/jpeg", "image/webp", "image/svg+xml", "application/pdf"];
const ACCEPT_EXT = /\.(png|jpe?g|webp|svg|pdf)$/i;
const MAX_BYTES = 64 * 1024 * 1024;
const PARALLEL = 3;

export type UploadRow = {
  id: string;
  name: string;
  size: number;
  progress: number;
  state: "waiting" | "uploading" | "checking" | "done" | "failed";
  message?: string;
  artworkId?: string;
};

type Props = {
  shopSlug: string;
  clientId: string | null;
  multiple?: boolean;
  label?: string;
  onUploaded?: (artworkId: string) => void;
};

function formatBytes(n: number) {
  return n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} KB`;
}

/** Quick checks in the browser; the server checks everything again from the bytes. */
function precheck(file: File): string | null {
  if (file.size === 0) return "The file is empty (0 bytes).";
  if (file.size > MAX_BYTES) return `The file is ${formatBytes(file.size)}; the limit is 64 MB.`;
  if (!ACCEPT.includes(file.type) && !ACCEPT_EXT.test(file.name)) return "Use PNG, JPEG, WebP, SVG or a single-page PDF.";
  return null;
}

function errorText(error: unknown): string {
  if (error && typeof error === "object" && "message" in error && typeof error.message === "string" && error.message) return error.message;
  return "The upload did not finish. Check the connection and try again.";
}

/** Drop several art files at once; each shows its own progress and its own result. */
export function DropZone({ shopSlug, clientId, multiple = true, label, onUploaded }: Props) {
  const [rows, setRows] = useState<UploadRow[]>([]);
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);

  const update = (id: string, patch: Partial<UploadRow>) => setRows((all) => all.map((r) => (r.id === id ? { ...r, ...patch } : r)));

  const uploadOne = useCallback(
    async (row: UploadRow, file: File) => {
      update(row.id, { state: "uploading", progress: 0 });
      try {
        // The upload client loads with the first file, not with every page that offers a drop zone.
        const { uploadFiles } = await import("./upload-helpers");
        const [result] = await uploadFiles("artwork", {
          files: [file],
          input: { shopSlug, clientId },
          onUploadProgress: ({ progress }) => update(row.id, { progress, state: progress >= 100 ? "checking" : "uploading" }),
        });
        const data = result?.serverData as { artworkId?: string; error?: string } | undefined;
        if (data?.artworkId) {
          update(row.id, { state: "done", progress: 100, artworkId: data.artworkId, message: "Added to the art library." });
          onUploaded?.(data.artworkId);
        } else {
          update(row.id, { state: "failed", message: data?.error ?? "The file was uploaded but could not be checked." });
        }
      } catch (error) {
        update(row.id, { state: "failed", message: errorText(error) });
      }
    },
    [clientId, onUploaded, shopSlug],
  );

  const start = useCallback(
    async (files: File[]) => {
      const chosen = multiple ? files : files.slice(0, 1);
      const queued = chosen.map((file) => {
        const problem = precheck(file);
        const row: UploadRow = { id: crypto.randomUUID(), name: file.name, size: file.size, progress: 0, state: problem ? "failed" : "waiting", message: problem ?? undefined };
        return { row, file, problem };
      });
      setRows((all) => [...queued.map((q) => q.row), ...all]);
      const work = queued.filter((q) => !q.problem);
      let next = 0;
      const worker = async () => {
        while (next < work.length) {
          const item = work[next++]!;
          await uploadOne(item.row, item.file);
        }
      };
      await Promise.all(Array.from({ length: Math.min(PARALLEL, work.length) }, worker));
    },
    [multiple, uploadOne],
  );

  const onDrop = (event: DragEvent) => {
    event.preventDefault();
    setOver(false);
    void start(Array.from(event.dataTransfer.files));
  };

  return (
    <div>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        data-testid="drop-zone"
        className={`rounded-card border-2 border-dashed px-6 py-8 text-center transition-colors ${over ? "border-patina-500 bg-patina-100" : "border-ink-200 bg-paper-50"}`}
      >
        <p className="font-medium text-ink-800">{label ?? "Drop art files here"}</p>
        <p className="mt-1 text-sm text-ink-500">PNG, JPEG, WebP, SVG or a single-page PDF, up to 64 MB each{multiple ? ", several at once" : ""}.</p>
        <button type="button" className="btn-quiet mt-4" onClick={() => input.current?.click()}>
          Choose files
        </button>
        <input
          ref={input}
          type="file"
          className="sr-only"
          aria-label="Art files"
          multiple={multiple}
          accept={[...ACCEPT, ".png,.jpg,.jpeg,.webp,.svg,.pdf"].join(",")}
          onChange={(e) => {
            void start(Array.from(e.target.files ?? []));
            e.target.value = "";
          }}
        />
      </div>
      {rows.length ? (
        <ul className="mt-4 space-y-2" aria-label="Uploads">
          {rows.map((r) => (
            <li key={r.id} className="card px-4 py-3" data-testid="upload-row" data-state={r.state} data-progress={Math.round(r.progress)} data-name={r.name}>
              <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
                <span className="min-w-0 truncate font-medium">{r.name}</span>
                <span className="text-xs text-ink-500">{formatBytes(r.size)}</span>
              </div>
              {r.state === "uploading" || r.state === "checking" || r.state === "waiting" ? (
                <div className="mt-2">
                  <div
                    role="progressbar"
                    aria-label={`Uploading ${r.name}`}
                    aria-valuemin={0}
                    aria-valuemax={100}
                    aria-valuenow={Math.round(r.progress)}
                    className="h-2 overflow-hidden rounded-full bg-paper-200"
                  >
                    <div className="h-full rounded-full bg-patina-500 transition-[width]" style={{ width: `${r.progress}%` }} />
                  </div>
                  <p className="mt-1 text-xs text-ink-500">
                    {r.state === "waiting" ? "Waiting…" : r.state === "checking" ? "Uploaded 100% · checking the art…" : `Uploading ${Math.round(r.progress)}%`}
                  </p>
                </div>
              ) : (
                <p className={`mt-1 text-sm ${r.state === "failed" ? "text-brick-700" : "text-patina-700"}`} role={r.state === "failed" ? "alert" : undefined}>
                  {r.message}
                </p>
              )}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
