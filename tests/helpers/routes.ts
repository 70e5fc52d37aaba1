// Calls route modules' loaders and actions with real Requests, a real session cookie and the real database.
import { eq } from "drizzle-orm";
import { db } from "../../app/lib/db.server";
import { sessionStorage } from "../../app/lib/session.server";
import { users } from "../../db/schema";

type Handler = (args: never) => unknown;
export interface Result {
  status: number;
  headers: Headers;
  body: unknown;
}

export async function cookieFor(email: string): Promise<string> {
  const [user] = await db().select().from(users).where(eq(users.email, email));
  if (!user) throw new Error(`No such person: ${email}`);
  const session = await sessionStorage().getSession();
  session.set("userId", user.id);
  const setCookie = await sessionStorage().commitSession(session);
  return setCookie.split(";")[0];
}

export function request(path: string, init: RequestInit & { cookie?: string; form?: Record<string, string> } = {}): Request {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set("Cookie", init.cookie);
  let body = init.body;
  if (init.form) {
    body = new URLSearchParams(init.form);
    headers.set("Content-Type", "application/x-www-form-urlencoded");
  }
  return new Request(`http://localhost:3999${path}`, { ...init, headers, body, method: init.method ?? (init.form ? "POST" : "GET") });
}

async function toResult(value: unknown): Promise<Result> {
  if (value instanceof Response) {
    const text = await value.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // a plain-text body stays text
    }
    return { status: value.status, headers: value.headers, body };
  }
  // React Router's data(value, init) wrapper.
  if (value && typeof value === "object" && (value as { type?: string }).type === "DataWithResponseInit") {
    const wrapped = value as unknown as { data: unknown; init: ResponseInit | null };
    return { status: wrapped.init?.status ?? 200, headers: new Headers(wrapped.init?.headers), body: wrapped.data };
  }
  return { status: 200, headers: new Headers(), body: value };
}

/** Runs a loader or action; a thrown Response (redirect, 403, 404) is returned like a returned one. */
export async function run(handler: Handler, req: Request, params: Record<string, string> = {}): Promise<Result> {
  try {
    return await toResult(await (handler as (args: unknown) => unknown)({ request: req, params, context: {} }));
  } catch (thrown) {
    if (thrown instanceof Response) return toResult(thrown);
    throw thrown;
  }
}
