import { describe, expect, it } from "vitest";
import { csvCell, csvLine } from "./csv-cell";

describe("csvCell", () => {
  it.each([
    ["=HYPERLINK(\"x\")", "\"'=HYPERLINK(\"\"x\"\")\""],
    ["+1", "'+1"],
    ["-2", "'-2"],
    ["@SUM(A1)", "'@SUM(A1)"],
    ["\tcmd", "'\tcmd"],
    ["\rcmd", "\"'\rcmd\""],
  ])("neutralises %j so a spreadsheet shows it as text", (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it("quotes commas, quotes and line breaks, and leaves plain text alone", () => {
    expect(csvCell("a,b")).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell("two\nlines")).toBe('"two\nlines"');
    expect(csvCell("AVP-AB-01")).toBe("AVP-AB-01");
  });

  it("writes numbers as they are, empty for null, and ends a line with CRLF", () => {
    expect(csvLine([12, null, "x"])).toBe("12,,x\r\n");
  });
});
