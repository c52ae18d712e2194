"use client";

import { useRouter } from "next/navigation";
import { useId, useMemo, useState, useTransition } from "react";
import { createProofAction } from "@/app/shops/[shop]/jobs/[jobId]/proofs/actions";
import { DropZone } from "@/components/artwork/DropZone";
import { LOCATION_LABELS, type PrintLocation } from "@/lib/garments/locations";

export type NewProofBlank = {
  id: string;
  name: string;
  categoryLabel: string;
  colours: Array<{ name: string; hex: string }>;
  locations: Array<{ value: PrintLocation; label: string }>;
  /** The size holding the middle garment of the job's run, on this blank's chart. */
  startSize: string;
};

type Props = {
  shopSlug: string;
  jobId: string;
  clientId: string;
  jobBlankId: string | null;
  jobColour: string | null;
  jobLocations: PrintLocation[];
  blanks: NewProofBlank[];
  artworks: Array<{ id: string; name: string }>;
};

/** Chooses the blank, colour and art of a new proof; the server lays the prints out at their usual spots. */
export function NewProofForm(props: Props) {
  const router = useRouter();
  const formId = useId();
  const [blankId, setBlankId] = useState(props.jobBlankId ?? props.blanks[0]?.id ?? "");
  const blank = props.blanks.find((b) => b.id === blankId) ?? null;
  const [colourName, setColourName] = useState(props.jobColour ?? "");
  const [name, setName] = useState("");
  // Art uploaded here shows at once; its stored name arrives with the page's refresh.
  const [uploaded, setUploaded] = useState<string[]>([]);
  const artworks = useMemo(() => [...uploaded.filter((id) => !props.artworks.some((a) => a.id === id)).map((id) => ({ id, name: "New upload (being added)" })), ...props.artworks], [uploaded, props.artworks]);
  const [uploadedName, setUploadedName] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();

  // The job's locations this blank offers; a job without any starts with the blank's first one.
  const locations = useMemo(() => {
    if (!blank) return [];
    const offered = blank.locations.map((l) => l.value);
    const wanted = props.jobLocations.length ? props.jobLocations : offered.slice(0, 1);
    return wanted.filter((l) => offered.includes(l));
  }, [blank, props.jobLocations]);
  const leftOff = blank ? props.jobLocations.filter((l) => !blank.locations.some((o) => o.value === l)) : [];
  const [art, setArt] = useState<Record<string, string>>({});
  const artFor = (location: PrintLocation) => art[location] ?? artworks[0]?.id ?? "";

  const colours = blank?.colours ?? [];
  const colourKnown = colours.some((c) => c.name.toLowerCase() === colourName.toLowerCase());
  const shownColour = colourKnown ? colourName : (colours[0]?.name ?? "");

  function submit(event: React.FormEvent) {
    event.preventDefault();
    setError(null);
    if (!blank) return setError("Pick a blank first.");
    startTransition(async () => {
      const result = await createProofAction({
        shopSlug: props.shopSlug,
        jobId: props.jobId,
        name: name.trim() || null,
        blankId: blank.id,
        colourName: shownColour || null,
        art: locations.map((location) => ({ location, artworkId: artFor(location) || null })),
      });
      if (!result.ok) return setError(result.error);
      router.push(result.data.url);
    });
  }

  return (
    <form onSubmit={submit} className="grid max-w-3xl gap-6" aria-describedby={error ? `${formId}-error` : undefined} data-hydrated={pending ? undefined : "true"}>
      <section className="card grid gap-4 p-5 sm:grid-cols-2" aria-labelledby={`${formId}-garment`}>
        <h2 id={`${formId}-garment`} className="text-base sm:col-span-2">
          Garment
        </h2>
        <div>
          <label htmlFor={`${formId}-blank`} className="field-label">
            Blank
          </label>
          <select id={`${formId}-blank`} className="field-input" value={blankId} onChange={(e) => setBlankId(e.target.value)}>
            {props.blanks.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name} ({b.categoryLabel.toLowerCase()})
              </option>
            ))}
          </select>
          {blank ? <p className="mt-1 text-xs text-ink-500">Starts at size {blank.startSize}, the middle of the size run.</p> : null}
        </div>
        <div>
          <label htmlFor={`${formId}-colour`} className="field-label">
            Colour
          </label>
          <select id={`${formId}-colour`} className="field-input" value={shownColour} onChange={(e) => setColourName(e.target.value)}>
            {colours.map((c) => (
              <option key={c.name} value={c.name}>
                {c.name}
              </option>
            ))}
          </select>
          {props.jobColour && !colourKnown && blank ? <p className="mt-1 text-xs text-ochre-800">{blank.name} does not come in {props.jobColour}.</p> : null}
        </div>
        <div className="sm:col-span-2">
          <label htmlFor={`${formId}-name`} className="field-label">
            Proof name <span className="font-normal text-ink-500">(optional)</span>
          </label>
          <input id={`${formId}-name`} className="field-input" value={name} maxLength={80} placeholder={blank ? `${blank.name}, ${shownColour}` : ""} onChange={(e) => setName(e.target.value)} />
        </div>
      </section>

      <section className="card space-y-4 p-5" aria-labelledby={`${formId}-prints`}>
        <h2 id={`${formId}-prints`} className="text-base">
          Prints
        </h2>
        <p className="text-sm text-ink-600">One print for each of the job&apos;s print locations, at that location&apos;s usual size and distance from the collar. Pick the art for each.</p>
        {leftOff.length ? (
          <p className="rounded-lg bg-ochre-50 p-3 text-sm text-ochre-800" role="note">
            This blank has no {leftOff.map((l) => LOCATION_LABELS[l].toLowerCase()).join(" or ")} print location, so {leftOff.length === 1 ? "it is" : "they are"} left off.
          </p>
        ) : null}
        {locations.map((location) => (
          <div key={location}>
            <label htmlFor={`${formId}-art-${location}`} className="field-label">
              Art for the {LOCATION_LABELS[location].toLowerCase()}
            </label>
            <select id={`${formId}-art-${location}`} className="field-input" value={artFor(location)} onChange={(e) => setArt((all) => ({ ...all, [location]: e.target.value }))}>
              <option value="">No art yet</option>
              {artworks.map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}
                </option>
              ))}
            </select>
          </div>
        ))}
        <div>
          <p className="field-label">Or upload new art for this client</p>
          <DropZone
            shopSlug={props.shopSlug}
            clientId={props.clientId}
            multiple={false}
            label="Drop the client's art here, or choose a file"
            onUploaded={(artworkId) => {
              // The new art goes first in the list and onto every print, ready to place.
              setUploaded((all) => [artworkId, ...all]);
              setArt(Object.fromEntries(locations.map((l) => [l, artworkId])));
              setUploadedName("The uploaded art is chosen for every print.");
              router.refresh();
            }}
          />
          {uploadedName ? (
            <p className="mt-2 text-sm text-patina-800" role="status">
              {uploadedName}
            </p>
          ) : null}
        </div>
      </section>

      {error ? (
        <p id={`${formId}-error`} role="alert" className="rounded-lg bg-brick-100 p-3 text-sm text-brick-800">
          {error}
        </p>
      ) : null}
      <div className="flex items-center gap-3">
        <button type="submit" className="btn-primary px-4 py-2" disabled={pending || !blank}>
          {pending ? "Making the proof…" : "Make proof and open the editor"}
        </button>
        <span aria-live="polite" className="text-sm text-ink-500">
          {pending ? "Laying out the prints…" : ""}
        </span>
      </div>
    </form>
  );
}
