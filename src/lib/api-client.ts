import { env } from './env';

/** An API answer that was not 2xx, with the server's message and field errors. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly code: string,
    readonly requestId?: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

type Listener = () => void;
const unauthorisedListeners = new Set<Listener>();
/** Called when any request answers 401 (the session ended): the app refreshes its session query. */
export function onUnauthorised(fn: Listener) {
  unauthorisedListeners.add(fn);
  return () => unauthorisedListeners.delete(fn);
}

async function request<T>(method: string, path: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(`${env.VITE_API_BASE}${path}`, {
      method,
      credentials: 'include',
      headers: body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiRequestError(0, 'Cohesia cannot be reached. Check your connection and try again.', 'network');
  }
  if (res.status === 204) return undefined as T;
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    if (res.status === 401) unauthorisedListeners.forEach((l) => l());
    throw new ApiRequestError(
      res.status,
      data?.message ?? `The server answered ${res.status}.`,
      data?.code ?? 'http_error',
      data?.requestId,
      data?.fields,
    );
  }
  return data as T;
}

/** A plain-text answer (citation files and the like). */
async function requestText(path: string): Promise<string> {
  let res: Response;
  try {
    res = await fetch(`${env.VITE_API_BASE}${path}`, { credentials: 'include' });
  } catch {
    throw new ApiRequestError(0, 'Cohesia cannot be reached. Check your connection and try again.', 'network');
  }
  if (!res.ok) throw new ApiRequestError(res.status, `The server answered ${res.status}.`, 'http_error');
  return res.text();
}

/** The one transport for our API; components never call fetch themselves. */
export const api = {
  text: requestText,
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
