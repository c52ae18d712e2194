import { redirect } from "next/navigation";
import { homePathFor, requireActorPage } from "@/app/_server/access";

export const dynamic = "force-dynamic";

/** After sign-in: send each person to their own starting place. */
export default async function HomeRedirect() {
  const actor = await requireActorPage("/home");
  redirect(homePathFor(actor));
}
