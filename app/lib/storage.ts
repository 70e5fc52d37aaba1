// What a certificate file may be: checked by its first bytes, not by the name or the type the browser claims.
export const MAX_CERTIFICATE_BYTES = 10 * 1024 * 1024;

export const CERTIFICATE_TYPES = {
  "application/pdf": { extension: "pdf", magic: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // %PDF-
  "image/png": { extension: "png", magic: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  "image/jpeg": { extension: "jpg", magic: [0xff, 0xd8, 0xff] },
} as const;

export type CertificateMediaType = keyof typeof CERTIFICATE_TYPES;

/** The media type the bytes really are (PDF, PNG or JPEG), or null. */
export function sniffCertificateType(bytes: Uint8Array): CertificateMediaType | null {
  for (const [type, { magic }] of Object.entries(CERTIFICATE_TYPES) as [CertificateMediaType, (typeof CERTIFICATE_TYPES)[CertificateMediaType]][]) {
    if (bytes.length >= magic.length && magic.every((b, i) => bytes[i] === b)) return type;
  }
  return null;
}

/** A refusal in words, or null when the upload may be stored. */
export function certificateProblem(file: { name: string; size: number }, bytes: Uint8Array): string | null {
  if (file.size === 0) return "The certificate file is empty.";
  if (file.size > MAX_CERTIFICATE_BYTES) return `The certificate file is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is 10 MB.`;
  if (!sniffCertificateType(bytes)) return `${file.name} is not a PDF, PNG or JPEG file (checked by its content, not its name).`;
  return null;
}
