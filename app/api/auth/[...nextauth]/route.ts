import NextAuth from "next-auth";
import { getAuthOptions } from "@/app/_server/auth";

export const dynamic = "force-dynamic";

type Context = { params: Promise<{ nextauth: string[] }> };

async function handler(request: Request, context: Context) {
  return NextAuth(getAuthOptions())(request, context);
}

export { handler as GET, handler as POST };
