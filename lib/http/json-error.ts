/** Every JSON error answer: `{ error, issues? }` with an honest status code. */
export function jsonError(status: number, error: string, issues?: { path: string; message: string }[], init: ResponseInit = {}) {
  return Response.json(issues ? { error, issues } : { error }, { ...init, status });
}
