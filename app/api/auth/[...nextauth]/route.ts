import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";

type Ctx = { params: Promise<{ nextauth: string[] }> };

// Options are built per request so `next build` never needs the runtime settings.
const handler = (req: Request, ctx: Ctx) => NextAuth(req as never, ctx as never, authOptions());

export { handler as GET, handler as POST };
