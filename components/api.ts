/** Client-side call to the app's JSON API. Errors come back in the API's own shape. */
export interface ApiFailure {
  status: number;
  code: string;
  message: string;
  fields: Record<string, string[]>;
  details?: Record<string, unknown>;
}

export class ApiRequestError extends Error {
  constructor(public readonly failure: ApiFailure) {
    super(failure.message);
  }
}

export async function api<T>(path: string, init?: { method?: string; body?: unknown; signal?: AbortSignal }): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method: init?.method ?? (init?.body === undefined ? "GET" : "POST"),
      headers: init?.body === undefined ? undefined : { "Content-Type": "application/json" },
      body: init?.body === undefined ? undefined : JSON.stringify(init.body),
      signal: init?.signal,
      credentials: "same-origin",
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    throw new ApiRequestError({ status: 0, code: "offline", message: "Could not reach the shop's server. Check the connection and try again.", fields: {} });
  }
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const error = (body as { error?: { code?: string; message?: string; details?: Record<string, unknown> } } | null)?.error;
    throw new ApiRequestError({
      status: res.status,
      code: error?.code ?? "internal",
      message: error?.message ?? `The server answered ${res.status}.`,
      fields: (error?.details?.fields as Record<string, string[]>) ?? {},
      details: error?.details,
    });
  }
  return body as T;
}
