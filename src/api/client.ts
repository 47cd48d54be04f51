/**
 * The one fetch wrapper of the client. Every API call goes through it so errors arrive in one shape.
 * On the web the API is served from the same origin as the app; EXPO_PUBLIC_API_URL points elsewhere when needed.
 */
const API_BASE = process.env.EXPO_PUBLIC_API_URL ?? '';

export type FieldErrors = Record<string, string[]>;

/** An error the client can show: `status` 0 means the server could not be reached at all. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fieldErrors: FieldErrors = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }

  get isNetwork(): boolean {
    return this.status === 0;
  }
}

type RequestOptions = { method?: string; body?: unknown; signal?: AbortSignal };

async function request<T>(path: string, { method = 'GET', body, signal }: RequestOptions = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(`${API_BASE}${path}`, {
      method,
      signal,
      credentials: 'include',
      headers: body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'network', 'Troughline’s server cannot be reached. Check the connection and try again.');
  }
  const text = await response.text();
  let payload: unknown = undefined;
  if (text) {
    try {
      payload = JSON.parse(text);
    } catch {
      // A proxy or a crashed server can answer with HTML; keep the status and say so plainly.
      throw new ApiError(response.status, 'bad_response', `The server answered with something that is not data (HTTP ${response.status}).`);
    }
  }
  if (!response.ok) {
    const error = (payload as { error?: { code?: string; message?: string; fieldErrors?: FieldErrors } } | undefined)?.error;
    throw new ApiError(response.status, error?.code ?? 'http_error', error?.message ?? `The server answered HTTP ${response.status}.`, error?.fieldErrors ?? {});
  }
  return payload as T;
}

export const apiClient = {
  get: <T>(path: string, signal?: AbortSignal) => request<T>(path, { signal }),
  post: <T>(path: string, body?: unknown) => request<T>(path, { method: 'POST', body: body ?? {} }),
  put: <T>(path: string, body: unknown) => request<T>(path, { method: 'PUT', body }),
  patch: <T>(path: string, body: unknown) => request<T>(path, { method: 'PATCH', body }),
  delete: <T>(path: string) => request<T>(path, { method: 'DELETE' }),
};
