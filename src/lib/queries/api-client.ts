/** An error answer from the API, with the fields to fix when the input was refused. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly errorName: string,
    message: string,
    readonly fields: Array<{ field: string; message: string }> = [],
  ) {
    super(message);
  }
}

/** fetch for the islands: JSON in and out, catalogue errors thrown as ApiError. */
export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? 'GET',
    headers: init.body === undefined ? undefined : { 'content-type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  const text = await res.text();
  const body = text ? JSON.parse(text) : null;
  if (!res.ok) throw new ApiError(res.status, body?.error ?? 'Error', body?.message ?? `The server answered ${res.status}.`, body?.fields ?? []);
  return body as T;
}
