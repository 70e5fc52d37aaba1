// Column mappings saved by name, so the next export from the same system maps itself.
import { asc, eq } from "drizzle-orm";
import { importMappings } from "../../db/schema";
import { ColumnMappingSchema, type ColumnMapping } from "../lib/csv-mapping";
import type { Database } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";
import { writeAudit } from "./audit.server";

export interface SavedMapping {
  id: number;
  name: string;
  mapping: ColumnMapping;
}

export async function listMappings(db: Database): Promise<SavedMapping[]> {
  const rows = await db.select({ id: importMappings.id, name: importMappings.name, mapping: importMappings.mapping }).from(importMappings).orderBy(asc(importMappings.name));
  return rows.flatMap((r) => {
    const parsed = ColumnMappingSchema.safeParse(r.mapping);
    return parsed.success ? [{ id: r.id, name: r.name, mapping: parsed.data }] : [];
  });
}

/** Saves under `name`, replacing a mapping of the same name; audited with what it replaced. */
export async function saveMapping(db: Database, viewer: Viewer, name: string, mapping: ColumnMapping): Promise<void> {
  await db.transaction(async (tx) => {
    const [before] = await tx.select().from(importMappings).where(eq(importMappings.name, name)).for("update");
    const [row] = before
      ? await tx.update(importMappings).set({ mapping }).where(eq(importMappings.id, before.id)).returning()
      : await tx.insert(importMappings).values({ name, mapping, createdById: viewer.id }).returning();
    await writeAudit(tx, { actorId: viewer.id, action: before ? "import_mapping.update" : "import_mapping.create", entityType: "import_mapping", entityId: String(row.id), before: before ? { mapping: before.mapping } : null, after: { name, mapping } });
  });
}
