import { describe, expect, it } from "vitest";
import { certificateProblem, sniffCertificateType } from "./storage";

const bytes = (...b: number[]) => new Uint8Array([...b, 0, 0, 0, 0]);

describe("certificate files are checked by content", () => {
  it("recognises PDF, PNG and JPEG by their first bytes", () => {
    expect(sniffCertificateType(new TextEncoder().encode("%PDF-1.7\n"))).toBe("application/pdf");
    expect(sniffCertificateType(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a))).toBe("image/png");
    expect(sniffCertificateType(bytes(0xff, 0xd8, 0xff, 0xe0))).toBe("image/jpeg");
  });

  it("refuses a text file named .pdf, an empty file and one over 10 MB", () => {
    const text = new TextEncoder().encode("not really a pdf");
    expect(certificateProblem({ name: "cert.pdf", size: text.length }, text)).toMatch(/not a PDF, PNG or JPEG/);
    expect(certificateProblem({ name: "cert.pdf", size: 0 }, new Uint8Array())).toMatch(/empty/);
    expect(certificateProblem({ name: "cert.pdf", size: 11 * 1024 * 1024 }, new TextEncoder().encode("%PDF-"))).toMatch(/limit is 10 MB/);
    expect(certificateProblem({ name: "cert.pdf", size: 5 }, new TextEncoder().encode("%PDF-"))).toBeNull();
  });
});
