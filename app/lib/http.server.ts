// Errors as RFC 9457 problem details for the API, and plain Responses for UI routes.
export interface FieldProblem {
  pointer: string;
  message: string;
}

export function problem(status: number, title: string, detail?: string, errors?: FieldProblem[]): Response {
  return new Response(JSON.stringify({ type: "about:blank", title, status, detail, errors }), {
    status,
    headers: { "Content-Type": "application/problem+json" },
  });
}

export const unauthorized = () =>
  problem(401, "Unauthorized", "Sign in, or send Authorization: Bearer <token>.");
export const forbidden = (detail = "Your role at this site does not allow this.") => problem(403, "Forbidden", detail);
export const notFound = (detail = "Not found.") => problem(404, "Not found", detail);

/** For UI loaders and actions: a thrown Response renders the nearest error boundary with this status. */
export function forbiddenPage(detail = "Your role at this site does not allow this."): Response {
  return new Response(detail, { status: 403, statusText: "Forbidden" });
}
export function notFoundPage(detail = "Not found."): Response {
  return new Response(detail, { status: 404, statusText: "Not found" });
}
