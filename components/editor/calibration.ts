"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { DEFAULT_PX_PER_INCH } from "@/lib/editor/view";
import { useLocalValue, writeLocalValue } from "./local-value";

const DEVICE_KEY = "chalkline.device";
const LOCAL_CAL = "chalkline.pxPerInch";

/** A random id for this browser on this device; calibrations are stored per person and device. */
export function useDeviceKey(): string | null {
  const key = useLocalValue(DEVICE_KEY);
  useEffect(() => {
    if (!window.localStorage.getItem(DEVICE_KEY)) writeLocalValue(DEVICE_KEY, crypto.randomUUID());
  }, []);
  return key;
}

export type Calibration = { pxPerInch: number; calibrated: boolean; loading: boolean };

/** CSS px per real inch on this screen: the stored calibration, or the CSS default of 96. */
export function useCalibration(signedIn: boolean): Calibration & { save: (pxPerInch: number) => Promise<void>; saving: boolean; error: string | null } {
  const device = useDeviceKey();
  const client = useQueryClient();
  const storedText = useLocalValue(LOCAL_CAL);
  const stored = storedText === null ? NaN : Number(storedText);
  const local = Number.isFinite(stored) && stored > 0 ? stored : null;
  const query = useQuery({
    queryKey: ["calibration", device],
    enabled: signedIn && !!device,
    queryFn: async () => {
      const response = await fetch(`/api/me/calibration?device=${encodeURIComponent(device!)}`);
      if (!response.ok) throw new Error("Could not load this screen's calibration.");
      return (await response.json()) as { pxPerInch: number | null };
    },
  });
  const mutation = useMutation({
    mutationFn: async (pxPerInch: number) => {
      writeLocalValue(LOCAL_CAL, String(pxPerInch));
      if (!signedIn || !device) return;
      const response = await fetch("/api/me/calibration", {
        method: "PUT",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ deviceKey: device, deviceLabel: navigator.userAgent.slice(0, 120), pxPerInch }),
      });
      if (!response.ok) {
        const body = (await response.json().catch(() => ({}))) as { error?: string };
        throw new Error(body.error ?? "Could not save the calibration.");
      }
    },
    onSuccess: () => client.invalidateQueries({ queryKey: ["calibration", device] }),
  });
  const server = query.data?.pxPerInch ?? null;
  const value = server ?? local;
  return {
    pxPerInch: value ?? DEFAULT_PX_PER_INCH,
    calibrated: value !== null,
    loading: query.isLoading,
    save: async (px) => {
      await mutation.mutateAsync(px);
    },
    saving: mutation.isPending,
    error: mutation.error ? mutation.error.message : null,
  };
}
