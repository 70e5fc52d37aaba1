import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { readMarker, RecordGuard } from "./csv-guard";

/** Feeds the text in pieces of `size` characters, as a stream would, and parses what comes out. */
function guarded(text: string, size: number, limit = 40, delimiter = ",") {
  const guard = new RecordGuard(delimiter, limit);
  let out = "";
  for (let i = 0; i < text.length; i += size) out += guard.push(text.slice(i, i + size));
  out += guard.end();
  return { out, rows: Papa.parse<string[]>(out, { delimiter, newline: "\n" }).data };
}

describe("RecordGuard", () => {
  it.each([1, 3, 7, 1000])("passes well-formed records through unchanged, in pieces of %i characters", (size) => {
    const text = 'a,b,c\n1,"two, with comma",3\n"x\ny",5,"say ""hi"""\n';
    expect(guarded(text, size).out).toBe(text);
  });

  it("ends every record with \\n, also CRLF and a last line without a break", () => {
    expect(guarded("a,b\r\n1,2\r\n3,4", 2).out).toBe("a,b\n1,2\n3,4\n");
  });

  it("keeps a CRLF inside a quoted cell", () => {
    expect(guarded('a,"x\r\ny"\r\n', 4).rows[0]).toEqual(["a", "x\r\ny"]);
  });

  it.each([1, 5, 1000])("turns a record over the limit into a marker with its length (pieces of %i)", (size) => {
    const long = "x".repeat(100);
    const { rows } = guarded(`a,b\n1,${long}\n2,3\n`, size);
    expect(rows.map((r) => readMarker(r))).toEqual([null, { kind: "too_long", newlines: 0, length: 102 }, null, null]);
    expect(rows[2]).toEqual(["2", "3"]);
  });

  it("marks text after a closing quote as broken quoting, and reads the next line normally", () => {
    const { rows } = guarded('1,"bad"x,8\n9,10\n', 3);
    expect(readMarker(rows[0])).toEqual({ kind: "bad_quotes", newlines: 0, length: 10 });
    expect(rows[1]).toEqual(["9", "10"]);
  });

  it("accepts spaces between a closing quote and the delimiter", () => {
    expect(guarded('"a"  ,b\n', 2).rows[0]).toEqual(["a", "b"]);
  });

  it("refuses only the first line of an opening quote that never closes, then reads on", () => {
    const lines = ['1,"never closed,2', ...Array.from({ length: 12 }, (_, i) => `${i},ok`)];
    const { rows } = guarded(`${lines.join("\n")}\n`, 4);
    expect(readMarker(rows[0])?.kind).toBe("bad_quotes");
    expect(rows.slice(1, 13).every((r) => r.length === 2 && r[1] === "ok")).toBe(true);
  });

  it("refuses an unterminated quote at the end of the file", () => {
    const { rows } = guarded('a,b\n1,"open', 3);
    expect(readMarker(rows[1])?.kind).toBe("bad_quotes");
  });

  it("counts line breaks inside a too-long quoted cell so later line numbers stay right", () => {
    const cell = `"${"y".repeat(30)}\n${"y".repeat(30)}"`;
    const { rows } = guarded(`h\n${cell}\nnext\n`, 7, 40);
    // The first 40 characters hold a line break, so only the first line is refused and the rest read again.
    expect(readMarker(rows[1])).toEqual({ kind: "bad_quotes", newlines: 0, length: 31 });
  });

  it("works with a semicolon delimiter", () => {
    expect(guarded('a;"1;2";3\n', 2, 40, ";").rows[0]).toEqual(["a", "1;2", "3"]);
  });
});
