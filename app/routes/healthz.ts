import { sql } from "drizzle-orm";
import { db } from "~/lib/db.server";

export async function loader() {
  const started = performance.now();
  try {
    await db().execute(sql`select 1`);
    return Response.json({ status: "ok", database: "reachable", ms: Math.round(performance.now() - started) });
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return Response.json({ status: "degraded", database: "unreachable", detail }, { status: 503 });
  }
}
