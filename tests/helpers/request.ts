/** Build a Request for a route handler, JSON by default. */
export function jsonRequest(method: string, url: string, body?: unknown, headers: Record<string, string> = {}): Request {
  const init: RequestInit = { method, headers: { ...headers } };
  if (body !== undefined) {
    init.body = typeof body === "string" ? body : JSON.stringify(body);
    (init.headers as Record<string, string>)["content-type"] ??= "application/json";
  }
  return new Request(new URL(url, "http://127.0.0.1:3000"), init);
}

export const ctx = (params: Record<string, string> = {}) => ({ params: Promise.resolve(params) });

export async function bodyOf(response: Response): Promise<unknown> {
  const text = await response.text();
  return text ? JSON.parse(text) : null;
}
