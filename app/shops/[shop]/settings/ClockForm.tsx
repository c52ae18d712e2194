"use client";

import { useMemo, useState } from "react";
import { useHydrated } from "@/components/orders/useHydrated";
import { formatShopDateTime } from "@/lib/dates";
import { saveShopClockAction } from "./actions";

/** Languages and regions offered for dates (our own short list; any BCP 47 tag the platform knows is accepted). */
const LOCALES: Array<[string, string]> = [
  ["en-US", "English (United States)"],
  ["en-CA", "English (Canada)"],
  ["en-GB", "English (United Kingdom)"],
  ["en-AU", "English (Australia)"],
  ["es-US", "Español (Estados Unidos)"],
  ["es-MX", "Español (México)"],
  ["fr-CA", "Français (Canada)"],
  ["de-DE", "Deutsch (Deutschland)"],
];

export function ClockForm({ shopSlug, locale, timeZone }: { shopSlug: string; locale: string; timeZone: string }) {
  const hydrated = useHydrated();
  const [values, setValues] = useState({ locale, timeZone });
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const zones = useMemo(() => {
    const all = typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : [];
    return all.includes(values.timeZone) ? all : [values.timeZone, ...all];
  }, [values.timeZone]);
  const sample = formatShopDateTime(new Date(), values);
  return (
    <form
      className="card space-y-4 p-5"
      aria-label="Dates and time zone"
      data-hydrated={hydrated}
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setNotice(null);
        const r = await saveShopClockAction({ shopSlug, ...values });
        setBusy(false);
        setNotice(r.ok ? { ok: true, text: "Saved. Spec sheets and pages now use these dates." } : { ok: false, text: r.error });
      }}
    >
      <h2 className="text-lg">Dates and time zone</h2>
      <div>
        <label htmlFor="clock-locale" className="field-label">
          Language and region for dates
        </label>
        <select id="clock-locale" className="field-input" value={values.locale} onChange={(e) => setValues((v) => ({ ...v, locale: e.target.value }))}>
          {(LOCALES.some(([id]) => id === values.locale) ? LOCALES : [[values.locale, values.locale] as [string, string], ...LOCALES]).map(([id, label]) => (
            <option key={id} value={id}>
              {label}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="clock-zone" className="field-label">
          Time zone
        </label>
        <select id="clock-zone" className="field-input" value={values.timeZone} onChange={(e) => setValues((v) => ({ ...v, timeZone: e.target.value }))}>
          {zones.map((z) => (
            <option key={z} value={z}>
              {z.replaceAll("_", " ")}
            </option>
          ))}
        </select>
        <p className="mt-1 text-xs text-ink-500">
          Now reads: <span data-testid="clock-sample">{sample}</span>
        </p>
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Saving…" : "Save dates"}
      </button>
      {notice ? (
        <p role={notice.ok ? "status" : "alert"} className={`text-sm ${notice.ok ? "text-patina-800" : "text-brick-700"}`}>
          {notice.text}
        </p>
      ) : null}
    </form>
  );
}
