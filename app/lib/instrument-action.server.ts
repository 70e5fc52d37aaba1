// The create and edit actions share parsing and refusal: 400 with field messages, nothing saved.
import { parseWithZod } from "@conform-to/zod/v4";
import { data } from "react-router";
import type { Viewer } from "./permissions";
import { can } from "./permissions";
import { forbiddenPage } from "./http.server";
import { InstrumentFormSchema, instrumentValues } from "./instrument-form";
import { DuplicateAssetTagError } from "../queries/instruments.server";

export async function parseInstrumentSubmission(request: Request, viewer: Viewer) {
  const formData = await request.formData();
  const submission = parseWithZod(formData, { schema: InstrumentFormSchema });
  if (submission.status !== "success") return { failure: data(submission.reply(), { status: 400 }) } as const;
  if (!can(viewer, "manage_instruments", submission.value.siteId)) throw forbiddenPage();
  return { submission, values: instrumentValues(submission.value) } as const;
}

export function duplicateTagFailure(submission: Extract<Awaited<ReturnType<typeof parseInstrumentSubmission>>, { values: unknown }>["submission"], error: unknown) {
  if (error instanceof DuplicateAssetTagError) return data(submission.reply({ fieldErrors: { assetTag: [error.message] } }), { status: 400 });
  throw error;
}
