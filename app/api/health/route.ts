import { NextResponse } from "next/server";
import { pingDatabase } from "@/db/queries/users";

export const dynamic = "force-dynamic";

export async function GET() {
  try {
    await Promise.race([
      pingDatabase(),
      new Promise((_, reject) => setTimeout(() => reject(new Error("database did not answer in 2 s")), 2_000)),
    ]);
    return NextResponse.json({ status: "ok", db: "ok" }, { headers: { "Cache-Control": "no-store" } });
  } catch {
    return NextResponse.json({ status: "degraded", db: "down" }, { status: 503, headers: { "Cache-Control": "no-store" } });
  }
}
