// Tareline's import fields, the mapping of a file's columns onto them, and the options chosen on the form.
// Shared by the mapping form (browser) and the import job (server), so both refuse the same settings.
import { z } from "zod";
import { MASS_UNITS } from "../../db/schema/enums";

export const IMPORT_FIELDS = ["asset_tag", "check_type", "performed_at", "unit", "weight", "readings", "operator_email", "note"] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];
export const REQUIRED_FIELDS: readonly ImportField[] = ["asset_tag", "check_type", "performed_at", "readings"];

export const FIELD_LABELS: Record<ImportField, string> = {
  asset_tag: "Asset tag",
  check_type: "Check type",
  performed_at: "Performed at",
  unit: "Unit",
  weight: "Test weight",
  readings: "Readings",
  operator_email: "Operator e-mail",
  note: "Note",
};

export const DELIMITERS = [",", ";", "\t"] as const;
export type Delimiter = (typeof DELIMITERS)[number];
export const DELIMITER_LABELS: Record<Delimiter, string> = { ",": "Comma ( , )", ";": "Semicolon ( ; )", "\t": "Tab" };

export const ENCODINGS = ["utf-8", "utf-16le", "utf-16be", "windows-1252"] as const;
export type Encoding = (typeof ENCODINGS)[number];
export const ENCODING_LABELS: Record<Encoding, string> = { "utf-8": "UTF-8", "utf-16le": "UTF-16 (little-endian)", "utf-16be": "UTF-16 (big-endian)", "windows-1252": "Latin-1 (Windows-1252)" };

export const IMPORT_MODES = ["all_or_nothing", "valid_rows"] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];

/** The time-zone choice that reads each row in the zone of its instrument's site. */
export const SITE_ZONE = "site";

/** Column label → Tareline field; columns not named are ignored. Several columns may feed "readings", in file order. */
export type ColumnMapping = Record<string, ImportField>;

export function isTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

export const ColumnMappingSchema = z.record(z.string().max(200), z.enum(IMPORT_FIELDS));

export const ImportSettingsSchema = z
  .object({
    mapping: ColumnMappingSchema,
    unit: z.enum(MASS_UNITS, { error: `The default unit is one of ${MASS_UNITS.join(", ")}.` }),
    timeZone: z.string().refine((z) => z === SITE_ZONE || isTimeZone(z), "Choose a time zone Tareline knows (an IANA name such as Europe/Berlin)."),
    mode: z.enum(IMPORT_MODES, { error: "Choose all-or-nothing, or import the valid rows." }),
    delimiter: z.enum(DELIMITERS, { error: "Choose the character between columns." }),
    encoding: z.enum(ENCODINGS, { error: "Choose the file's character encoding." }),
  })
  .superRefine((settings, ctx) => {
    const used = Object.values(settings.mapping);
    for (const field of REQUIRED_FIELDS) {
      if (!used.includes(field)) ctx.addIssue({ code: "custom", path: ["mapping", field], message: `Map a column to ${FIELD_LABELS[field]}.` });
    }
    for (const field of IMPORT_FIELDS) {
      if (field !== "readings" && used.filter((f) => f === field).length > 1) {
        ctx.addIssue({ code: "custom", path: ["mapping", field], message: `Only one column can be ${FIELD_LABELS[field]}.` });
      }
    }
  });

export type ImportSettings = z.infer<typeof ImportSettingsSchema>;

const normalise = (name: string) => name.trim().toLowerCase().replace(/[\s-]+/g, "_");
const SYNONYMS: Record<string, ImportField> = { instrument: "asset_tag", type: "check_type", time: "performed_at", operator: "operator_email" };

/** Columns named like Tareline's own format (any case, spaces or dashes for underscores) are mapped at once. */
export function suggestMapping(labels: string[]): ColumnMapping {
  const mapping: ColumnMapping = {};
  for (const label of labels) {
    const key = normalise(label);
    const field = (IMPORT_FIELDS as readonly string[]).includes(key) ? (key as ImportField) : SYNONYMS[key] ?? (/^readings?_?\d+$/.test(key) ? "readings" : undefined);
    if (field && (field === "readings" || !Object.values(mapping).includes(field))) mapping[label] = field;
  }
  return mapping;
}

/** Header cells as labels a person can pick: trimmed, an empty one named by position, a repeated one numbered. */
export function columnLabels(header: string[]): string[] {
  const seen = new Map<string, number>();
  return header.map((cell, i) => {
    const base = cell.trim() || `Column ${i + 1}`;
    const count = (seen.get(base) ?? 0) + 1;
    seen.set(base, count);
    return count === 1 ? base : `${base} (${count})`;
  });
}
