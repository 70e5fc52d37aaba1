// The character between columns, told from the header line: the candidate that occurs most outside quotes.
import { DELIMITERS, type Delimiter } from "./csv-mapping";

/** The first line that is not blank, up to its line break outside quotes. */
export function firstRecord(text: string): string {
  let inQuotes = false;
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') inQuotes = !inQuotes;
    else if (c === "\n" && !inQuotes) {
      const line = text.slice(start, i).replace(/\r$/, "");
      if (line.trim()) return line;
      start = i + 1;
    }
  }
  return text.slice(start);
}

export function detectDelimiter(text: string): Delimiter {
  const header = firstRecord(text);
  const counts = new Map<Delimiter, number>(DELIMITERS.map((d) => [d, 0]));
  let inQuotes = false;
  for (const c of header) {
    if (c === '"') inQuotes = !inQuotes;
    else if (!inQuotes && counts.has(c as Delimiter)) counts.set(c as Delimiter, (counts.get(c as Delimiter) ?? 0) + 1);
  }
  let best: Delimiter = ",";
  for (const d of DELIMITERS) if ((counts.get(d) ?? 0) > (counts.get(best) ?? 0)) best = d;
  return best;
}
