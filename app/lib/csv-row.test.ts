import { describe, expect, it } from "vitest";
import { columnLabels, suggestMapping } from "./csv-mapping";
import { rowUnit, splitReadings } from "./csv-readings";
import { columnLayout, linesSpanned, readRow } from "./csv-row";

const labels = ["Instrument", "Type", "When", "R1", "R2", "Remarks"];
const layout = columnLayout(labels, { Instrument: "asset_tag", Type: "check_type", When: "performed_at", R1: "readings", R2: "readings", Remarks: "note" }, ";");

describe("readRow", () => {
  it("collects several readings columns in file order and trims every cell", () => {
    expect(readRow([" AVP-AB-01 ", "sensitivity", "2026-11-02 08:15", "200,0001", " 200,0002 ", ""], layout, 7)).toEqual({
      kind: "row",
      values: { asset_tag: "AVP-AB-01", check_type: "sensitivity", performed_at: "2026-11-02 08:15", note: "" },
      readingCells: ["200,0001", "200,0002"],
      fields: [" AVP-AB-01 ", "sensitivity", "2026-11-02 08:15", "200,0001", " 200,0002 ", ""],
    });
  });

  it("calls a line of blanks or bare delimiters empty", () => {
    expect(readRow(["", " ", "", "", "", ""], layout, 3)).toEqual({ kind: "empty" });
  });

  it("names an empty required field and the column it was mapped from", () => {
    const read = readRow(["AVP-AB-01", "", "2026-11-02 08:15", "1", "", ""], layout, 4);
    expect(read).toMatchObject({ kind: "problems", problems: [{ line: 4, column: "Type", reason: "Check type is empty." }] });
  });

  it("refuses a cell over 2,000 characters", () => {
    const read = readRow(["AVP-AB-01", "sensitivity", "2026-11-02 08:15", "1", "", "n".repeat(2001)], layout, 5);
    expect(read).toMatchObject({ kind: "problems", problems: [{ column: "Remarks", reason: "The value is 2,001 characters long; a cell holds at most 2,000." }] });
  });

  it("refuses a zero byte or another control character in a cell", () => {
    const read = readRow(["AVP-AB-01", "sensitivity", "2026-11-02 08:15", "1", "", "bad\u0000note"], layout, 6);
    expect(read).toMatchObject({ kind: "problems", problems: [{ column: "Remarks", reason: expect.stringMatching(/^The value holds a control character/) }] });
  });
});

describe("linesSpanned", () => {
  it("counts line breaks inside quoted cells, and those a marker records", () => {
    expect(linesSpanned(["a", "two\nlines\nhere"])).toBe(3);
    expect(linesSpanned(["\u0001bad_quotes:4:120"])).toBe(5);
  });
});

describe("mapping helpers", () => {
  it("labels empty and repeated header cells so each column can be picked", () => {
    expect(columnLabels(["Reading", "", "Reading", " Note "])).toEqual(["Reading", "Column 2", "Reading (2)", "Note"]);
  });

  it("maps Tareline's own names in any case, and numbered reading columns", () => {
    expect(suggestMapping(["Asset tag", "CHECK_TYPE", "performed-at", "reading_1", "Reading 2", "Operator"])).toEqual({
      "Asset tag": "asset_tag",
      CHECK_TYPE: "check_type",
      "performed-at": "performed_at",
      reading_1: "readings",
      "Reading 2": "readings",
      Operator: "operator_email",
    });
  });

  it("takes a row's unit from its unit cell, else from its readings, else the default", () => {
    expect(splitReadings(["1 | 2", "", "3|"])).toEqual(["1", "2", "3"]);
    expect(rowUnit("KG", ["1"], "g")).toEqual({ ok: true, unit: "kg" });
    expect(rowUnit(undefined, ["100.0003 g", "100.0004 G"], "kg")).toEqual({ ok: true, unit: "g" });
    expect(rowUnit("", ["100.0003"], "mg")).toEqual({ ok: true, unit: "mg" });
    expect(rowUnit("lb", ["1"], "g")).toEqual({ ok: false, message: '"lb" is not a unit Tareline reads; use mg, g, kg.' });
  });
});
