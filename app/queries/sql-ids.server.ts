import { sql, type SQL } from "drizzle-orm";

/**
 * `expr = any(array[…]::int[])` for whole-number ids; an empty list matches nothing. The ids are written into the
 * statement (after Number(), so only digits get there) because a drizzle template spreads an array parameter into a
 * list, and one array keeps the plan the same whatever the number of ids.
 */
export function anyId(expr: SQL, ids: number[]): SQL {
  return sql`${expr} = any(${sql.raw(`array[${(ids.length ? ids : [-1]).map(Number).join(",")}]::int[]`)})`;
}
