// The readings' text stored with each check, computed by the database function every insert path shares, so the
// copy on the check can never differ from the rows in check_readings written from the same values.
import { sql, type SQL } from "drizzle-orm";

/** A PostgreSQL array literal; every element quoted, null as NULL. */
function arrayLiteral(items: (string | null)[]): string {
  return `{${items.map((v) => (v === null ? "NULL" : `"${v.replace(/["\\]/g, "\\$&")}"`)).join(",")}}`;
}

export function readingsEnteredSql(readings: { entered: string; position: string | null }[]): SQL {
  return sql`readings_as_entered(${arrayLiteral(readings.map((r) => r.entered))}::numeric[], ${arrayLiteral(readings.map((r) => r.position))}::text[])`;
}
