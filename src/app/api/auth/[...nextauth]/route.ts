import NextAuth from "next-auth";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { authOptions } from "@/server/auth/options";
import { refusedAuthInput } from "@/server/auth/next-auth-input";
import { clientIp, consume } from "@/server/auth/rate-limit";
import { emailSchema } from "@/server/auth/schemas";

type Context = { params: Promise<{ nextauth: string[] }> };

/**
 * next-auth answers a refused sign-in with `{ url }` pointing at the sign-in
 * page with `?error=`; its client reads the message from there.
 */
function refuse(error: AppError): Response {
  const url = new URL("/sign-in", env().NEXTAUTH_URL);
  url.searchParams.set("error", error.message);
  return Response.json({ url: url.toString() }, { status: error.status });
}

/**
 * A sign-in link request is limited per e-mail and per address before
 * next-auth sends anything; the answer is the same whether or not the
 * account exists (next-auth then sends a link either way).
 */
async function limitLinkRequest(request: Request): Promise<Response | null> {
  const form = await request
    .clone()
    .formData()
    .catch(() => null);
  const email = emailSchema.safeParse(form?.get("email"));
  if (!email.success)
    return refuse(new AppError("bad_request", email.error.issues[0]?.message ?? "Enter a valid e-mail address."));
  try {
    await consume([
      ["mailEmail", email.data],
      ["mailIp", clientIp(request.headers)],
    ]);
  } catch (error) {
    if (error instanceof AppError) return refuse(error);
    throw error;
  }
  return null;
}

async function handler(request: Request, context: Context): Promise<Response> {
  const { nextauth } = await context.params;
  const wrong = await refusedAuthInput(request, nextauth);
  if (wrong) return refuse(wrong);
  if (request.method === "POST" && nextauth.join("/") === "signin/email") {
    const refused = await limitLinkRequest(request);
    if (refused) return refused;
  }
  return (NextAuth(authOptions()) as (request: Request, context: Context) => Promise<Response>)(request, context);
}

export { handler as GET, handler as POST };
