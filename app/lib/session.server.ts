import { createCookieSessionStorage } from "react-router";
import { env } from "./env.server";

export interface SessionData {
  userId: number;
}
export interface SessionFlash {
  flash: string;
}

let storage: ReturnType<typeof createCookieSessionStorage<SessionData, SessionFlash>> | undefined;

export function sessionStorage() {
  storage ??= createCookieSessionStorage<SessionData, SessionFlash>({
    cookie: {
      name: "__tareline",
      httpOnly: true,
      sameSite: "lax",
      path: "/",
      secure: env().APP_URL.startsWith("https://"),
      secrets: [env().SESSION_SECRET],
      maxAge: 60 * 60 * 12,
    },
  });
  return storage;
}

export async function getSession(request: Request) {
  return sessionStorage().getSession(request.headers.get("Cookie"));
}
