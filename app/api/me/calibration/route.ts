import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import { getActor } from "@/app/_server/access";
import { getCalibration, saveCalibration } from "@/db/queries/proofs";
import { MAX_PX_PER_INCH, MIN_PX_PER_INCH } from "@/lib/editor/view";
import { parseInput, readJson } from "@/lib/input";

export const dynamic = "force-dynamic";

const deviceKey = z.string().regex(/^[A-Za-z0-9-]{8,64}$/, "Device key must be 8 to 64 letters, digits or dashes.");
const putSchema = z.object({
  deviceKey,
  deviceLabel: z.string().trim().max(120).nullable().default(null),
  pxPerInch: z
    .number()
    .min(MIN_PX_PER_INCH, `Calibration must be at least ${MIN_PX_PER_INCH} px per inch.`)
    .max(MAX_PX_PER_INCH, `Calibration must be at most ${MAX_PX_PER_INCH} px per inch.`),
});

/** This person's screen calibration on one device. */
export async function GET(request: NextRequest) {
  const actor = await getActor();
  if (!actor) return NextResponse.json({ error: "Sign in to continue." }, { status: 401 });
  const parsed = parseInput(deviceKey, request.nextUrl.searchParams.get("device"));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues[0]!.message }, { status: 400 });
  const row = await getCalibration({ userId: actor.id, deviceKey: parsed.data });
  return NextResponse.json({ pxPerInch: row?.pxPerInch ?? null, updatedAt: row?.updatedAt ?? null });
}

export async function PUT(request: NextRequest) {
  const actor = await getActor();
  if (!actor) return NextResponse.json({ error: "Sign in to continue." }, { status: 401 });
  const parsed = parseInput(putSchema, await readJson(request));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues[0]?.message ?? "Invalid calibration." }, { status: 400 });
  await saveCalibration({ userId: actor.id, ...parsed.data });
  return NextResponse.json({ pxPerInch: parsed.data.pxPerInch });
}
