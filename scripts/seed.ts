// `npm run db:seed`: the demo scenario into DATABASE_URL (idempotent).
import { createDatabase } from "../app/lib/db.server";
import { seedDemo } from "../db/seed/seed";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("DATABASE_URL is not set.");
  process.exit(2);
}
const db = createDatabase(url, 2);
const result = await seedDemo(db);
console.log(result.created ? `Seeded ${result.instruments} instruments.` : "Demo data already present; nothing added.");
await db.$client.end();
