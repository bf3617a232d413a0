import type { ApiErrorBody } from "@shared/schemas/common";
import { offlineAnswer } from "./offline/fallback";

/** A failed API call, with the server's code, message and per-field messages. */
export class ApiError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public fields: Record<string, string> = {},
  ) {
    super(message);
    this.name = "ApiError";
  }
}

let csrfToken: string | null = null;
let onUnauthorized: (() => void) | null = null;

/** Called on a 401 from any request except the sign-in check itself. */
export function setUnauthorizedHandler(fn: () => void) {
  onUnauthorized = fn;
}

/** Forgets the CSRF token (after sign-in or sign-out the session changes). */
export function resetCsrfToken() {
  csrfToken = null;
}

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  const res = await fetch("/api/auth/csrf", { credentials: "same-origin" });
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return csrfToken;
}

type Method = "GET" | "POST" | "PATCH" | "PUT" | "DELETE";

async function request<T>(
  method: Method,
  url: string,
  body?: unknown,
  opts: { raw?: boolean; retried?: boolean; signal?: AbortSignal } = {},
): Promise<T> {
  const headers: Record<string, string> = { Accept: "application/json" };
  const isForm = typeof FormData !== "undefined" && body instanceof FormData;
  if (body !== undefined && !isForm) headers["Content-Type"] = "application/json";
  let res: Response;
  try {
    if (method !== "GET") headers["X-CSRF-Token"] = await getCsrfToken();
    res = await fetch(`/api${url}`, {
      method,
      headers,
      credentials: "same-origin",
      body: body === undefined ? undefined : isForm ? (body as FormData) : JSON.stringify(body),
      signal: opts.signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    // The network could not be reached. Reads fall back to what this device saved for offline use
    // (network first: a reachable server always answers); writes say plainly that nothing was sent.
    if (method === "GET") {
      const saved = await offlineAnswer(url).catch(() => undefined);
      if (saved !== undefined) return (opts.raw ? saved : saved.data) as T;
      throw new ApiError(0, "offline", "No connection, and this is not saved on this device for use without a signal.");
    }
    throw new ApiError(0, "offline", "No connection: nothing was sent. Try again when the signal is back.");
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  const json = text ? (JSON.parse(text) as unknown) : undefined;
  if (!res.ok) {
    const err = (json as ApiErrorBody | undefined)?.error;
    if (err?.code === "csrf_invalid" && !opts.retried) {
      resetCsrfToken();
      return request<T>(method, url, body, { ...opts, retried: true });
    }
    if (res.status === 401 && url !== "/auth/me" && url !== "/auth/login") onUnauthorized?.();
    throw new ApiError(res.status, err?.code ?? "http_error", err?.message ?? `Request failed (${res.status})`, err?.fields ?? {});
  }
  if (opts.raw) return json as T;
  return (json as { data: T }).data;
}

/** The one API client: base /api, same-origin cookies, CSRF header, typed errors. */
export const api = {
  get: <T>(url: string, signal?: AbortSignal) => request<T>("GET", url, undefined, { signal }),
  getRaw: <T>(url: string, signal?: AbortSignal) => request<T>("GET", url, undefined, { raw: true, signal }),
  post: <T>(url: string, body?: unknown) => request<T>("POST", url, body ?? {}),
  patch: <T>(url: string, body: unknown) => request<T>("PATCH", url, body),
  put: <T>(url: string, body: unknown) => request<T>("PUT", url, body),
  delete: <T = void>(url: string) => request<T>("DELETE", url),
  upload: <T>(url: string, form: FormData) => request<T>("POST", url, form),
};

/** Builds a query string, skipping empty values. */
export function qs(params: Record<string, string | number | boolean | null | undefined>): string {
  const s = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== "") s.set(k, String(v));
  const out = s.toString();
  return out ? `?${out}` : "";
}
