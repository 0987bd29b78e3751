/**
 * Where to go after sign-in: a same-origin path only. Parsed as a URL against a placeholder
 * origin, so `/\evil.example/`, `/%09/evil.example/`, tabs, newlines and `//host` (which browsers
 * read as another site) all fall back to home.
 */
export function safeNext(value: string | undefined | null): string {
  if (!value || !value.startsWith("/")) return "/";
  let decoded: string;
  try {
    decoded = decodeURIComponent(value);
  } catch {
    return "/";
  }
  // Checked on the text and on its decoded form: a later hop may decode `%09` or `%5C`.
  if ([value, decoded].some((v) => /[\\\u0000-\u001f\u007f]/.test(v) || v.startsWith("//"))) return "/";
  const origin = "http://heatpath.invalid";
  let url: URL;
  try {
    url = new URL(value, origin);
  } catch {
    return "/";
  }
  if (url.origin !== origin) return "/";
  const path = `${url.pathname}${url.search}${url.hash}`;
  // A decoded path that starts with two slashes would be read as another host on the next hop.
  return path.startsWith("//") ? "/" : path;
}
