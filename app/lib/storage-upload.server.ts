// Reads a certificate upload from a multipart form, refusing an oversize body before buffering it.
import { data } from "react-router";
import { certificateProblem, MAX_CERTIFICATE_BYTES, sniffCertificateType } from "./storage";
import type { CertificateUpload } from "../queries/weights.server";

const FORM_OVERHEAD = 64 * 1024;

/** The form data, or a 413 when the declared body is larger than a certificate may be. */
export async function readUploadForm(request: Request): Promise<FormData> {
  const declared = Number(request.headers.get("Content-Length") ?? "0");
  if (declared > MAX_CERTIFICATE_BYTES + FORM_OVERHEAD) throw data({ certificateError: "The upload is larger than 10 MB." }, { status: 413 });
  return request.formData();
}

export async function certificateFrom(form: FormData): Promise<{ upload: CertificateUpload | null; problem: string | null }> {
  const file = form.get("certificate");
  if (!(file instanceof File) || (file.size === 0 && !file.name)) return { upload: null, problem: null };
  const bytes = new Uint8Array(await file.arrayBuffer());
  const problem = certificateProblem({ name: file.name || "The file", size: file.size }, bytes);
  if (problem) return { upload: null, problem };
  return { upload: { bytes, mediaType: sniffCertificateType(bytes)!, fileName: file.name.slice(0, 200) }, problem: null };
}
