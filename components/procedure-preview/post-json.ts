import type { ApiErrorBody } from "@/lib/api/error-response";
import type { FieldProblem } from "@/protocols";

/** A refused request, with the field problems the API named (a 422 lists them by path). */
export class ApiRequestError extends Error {
  readonly status: number;
  readonly fields: FieldProblem[];
  constructor(status: number, message: string, fields: FieldProblem[] = []) {
    super(message);
    this.name = "ApiRequestError";
    this.status = status;
    this.fields = fields;
  }
}

async function readJson<T>(response: Response): Promise<T> {
  const body: unknown = await response.json().catch(() => null);
  if (response.ok) return body as T;
  const error = (body as Partial<ApiErrorBody> | null)?.error;
  throw new ApiRequestError(response.status, error?.message ?? `The server answered ${response.status}.`, error?.fields ?? []);
}

/** GET a JSON route of this app. */
export async function getJson<T>(url: string, signal?: AbortSignal): Promise<T> {
  return readJson<T>(await fetch(url, { headers: { accept: "application/json" }, signal }));
}

/** POST JSON to a route of this app; the browser adds the Origin header the server checks. */
export async function postJson<T>(url: string, body: unknown, signal?: AbortSignal): Promise<T> {
  const response = await fetch(url, {
    method: "POST",
    headers: { "content-type": "application/json", accept: "application/json" },
    body: JSON.stringify(body),
    signal,
  });
  return readJson<T>(response);
}
