// Domain refusals, mapped to HTTP at the edge (problem+json for the API, field messages for forms).
export interface Problem {
  pointer: string;
  message: string;
}

export class CheckRefused extends Error {
  constructor(
    readonly status: 403 | 404 | 409 | 422,
    readonly problems: Problem[],
    readonly title = "The check was not recorded",
  ) {
    super(problems.map((p) => p.message).join(" "));
  }
}
