import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { CsvRecordEnds } from "./csv-record-ends";

async function through(chunks: string[]) {
  const ends = new CsvRecordEnds();
  const out: Buffer[] = [];
  for await (const part of Readable.from(chunks.map((c) => Buffer.from(c))).pipe(ends)) out.push(part as Buffer);
  return { text: Buffer.concat(out).toString(), records: ends.records };
}

// RFC 4180 §2: records end with CRLF; a quoted field may hold line breaks and doubled quotes.
describe("CsvRecordEnds", () => {
  it("ends each record with CRLF and counts them", async () => {
    expect(await through(["1,a\n2,b\n"])).toEqual({ text: "1,a\r\n2,b\r\n", records: 2 });
  });

  it("keeps a line break inside a quoted cell, also with doubled quotes around it", async () => {
    expect(await through(['1,"two\nlines",x\n2,"say ""hi""\nthere"\n'])).toEqual({ text: '1,"two\nlines",x\r\n2,"say ""hi""\nthere"\r\n', records: 2 });
  });

  it("follows the quotes across chunk boundaries", async () => {
    const whole = '1,"a\nb"\n2,"c""\nd"\n3,e\n';
    const expected = '1,"a\nb"\r\n2,"c""\nd"\r\n3,e\r\n';
    for (let cut = 0; cut <= whole.length; cut++) {
      expect(await through([whole.slice(0, cut), whole.slice(cut)])).toEqual({ text: expected, records: 3 });
    }
  });

  it("passes a chunk without a record end through unchanged", async () => {
    expect(await through(["1,abc", "def\n"])).toEqual({ text: "1,abcdef\r\n", records: 1 });
  });
});
