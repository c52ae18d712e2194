import { NextResponse } from "next/server";
import { z } from "zod";
import { notifyDecision } from "@/app/_server/notify";
import { clientAddress } from "@/app/_server/client-address";
import { addressSubject, LIMITS, limitResponse, takeLimits } from "@/app/_server/rate-limit";
import { resolveReview } from "@/app/_server/review";
import { recordDecision } from "@/db/queries/review";
import { APPROVAL_STATEMENT } from "@/lib/review/approval";
import { parseInput, readJson } from "@/lib/input";

export const dynamic = "force-dynamic";


const schema = z.discriminatedUnion("decision", [
  z.object({
    decision: z.literal("approved"),
    letter: z.string().regex(/^[A-Z]{1,3}$/),
    fullName: z.string().trim().min(3, "Type your full name.").max(120).refine((v) => /\S\s+\S/.test(v), "Type your full name: first and last."),
    confirmed: z.literal(true, { message: "Tick the box to confirm you checked everything." }),
  }),
  z.object({
    decision: z.literal("changes-requested"),
    letter: z.string().regex(/^[A-Z]{1,3}$/),
    fullName: z.string().trim().min(1, "Type your name.").max(120),
    comment: z.string().trim().min(3, "Say what should change.").max(2000),
  }),
]);

export async function POST(request: Request, { params }: { params: Promise<{ kind: string; key: string }> }) {
  const { kind, key } = await params;
  const access = await resolveReview(kind, key);
  if (!access.ok) return NextResponse.json({ error: access.message }, { status: access.status });
  const reviewer = access.reviewer;
  if (!reviewer.canApprove) return NextResponse.json({ error: "This link cannot approve or request changes." }, { status: 403 });
  // The address kept with the decision as evidence, and counted by the limit: the socket's (or a trusted proxy's word).
  const ip = clientAddress(request);
  const taken = await takeLimits({ rule: LIMITS.decision, subject: `${reviewer.kind === "link" ? reviewer.link.id : reviewer.actor.id} ${addressSubject(ip)}` });
  if (!taken.ok) return limitResponse(taken, "Too many tries. Wait a minute and try again.");
  const parsed = parseInput(schema, await readJson(request));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues[0]?.message ?? "That could not be read." }, { status: 400 });
  const input = parsed.data;
  const result = await recordDecision({
    proofId: reviewer.proofId,
    letter: input.letter,
    decision: input.decision,
    fullName: input.fullName,
    statement: input.decision === "approved" ? APPROVAL_STATEMENT : "Changes requested.",
    comment: input.decision === "changes-requested" ? input.comment : null,
    ip,
    userAgent: request.headers.get("user-agent")?.slice(0, 400) ?? null,
    shareLinkId: reviewer.kind === "link" ? reviewer.link.id : null,
    userId: reviewer.kind === "link" ? null : reviewer.actor.id,
  });
  if (!result.ok) return NextResponse.json({ error: result.message }, { status: 409 });
  const approverEmail = reviewer.kind === "link" ? reviewer.link.recipientEmail : reviewer.actor.email;
  void notifyDecision({ proofId: reviewer.proofId, decision: input.decision, name: input.fullName, letter: input.letter, comment: input.decision === "changes-requested" ? input.comment : null, approverEmail });
  return NextResponse.json({ ok: true, approvalId: result.approvalId }, { status: 201 });
}
