import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { CsvTextStream, EncodingSniffer } from "./csv-decode.server";

function sniff(bytes: Buffer, pieces = 3) {
  const sniffer = new EncodingSniffer();
  const size = Math.ceil(bytes.length / pieces);
  for (let i = 0; i < bytes.length; i += size) sniffer.feed(bytes.subarray(i, i + size));
  return sniffer.result();
}

const utf16be = (text: string) => Buffer.from(text, "utf16le").swap16();

describe("EncodingSniffer", () => {
  const text = "asset_tag;note\nAVP-AB-01;Wägung über 200 g, µ-Waage\n";
  it.each([
    ["UTF-8 with a byte-order mark", Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)]), { encoding: "utf-8", bom: true }],
    ["UTF-8 without one", Buffer.from(text), { encoding: "utf-8", bom: false }],
    ["UTF-16LE with a mark", Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, "utf16le")]), { encoding: "utf-16le", bom: true }],
    ["UTF-16BE with a mark", Buffer.concat([Buffer.from([0xfe, 0xff]), utf16be(text)]), { encoding: "utf-16be", bom: true }],
    ["UTF-16LE without a mark", Buffer.from(text, "utf16le"), { encoding: "utf-16le", bom: false }],
    ["Latin-1", Buffer.from(text, "latin1"), { encoding: "windows-1252", bom: false }],
  ])("tells %s", (_name, bytes, expected) => {
    expect(sniff(bytes)).toMatchObject({ ...expected, binary: false });
  });

  it("keeps UTF-8 when a multi-byte character is split between chunks", () => {
    const bytes = Buffer.from("ä".repeat(1000));
    expect(sniff(bytes, 7).encoding).toBe("utf-8");
  });

  it("calls a file with zero bytes that are not UTF-16 binary", () => {
    expect(sniff(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x14, 0x00, 0x08, 0x00, 0x00, 0x00])).binary).toBe(true);
  });
});

describe("CsvTextStream", () => {
  it("decodes each encoding to the same records, without the byte-order mark", async () => {
    const text = "a;b\n1;ü\n";
    for (const [encoding, bytes] of [["utf-8", Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)])], ["utf-16le", Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, "utf16le")])], ["utf-16be", utf16be(text)], ["windows-1252", Buffer.from(text, "latin1")]] as const) {
      const stream = new CsvTextStream(encoding, ";");
      const pieces: string[] = [];
      for await (const piece of Readable.from([bytes.subarray(0, 5), bytes.subarray(5)]).pipe(stream)) pieces.push(piece as string);
      expect(pieces.join("")).toBe(text);
      expect(stream.bytesRead).toBe(bytes.length);
    }
  });
});
