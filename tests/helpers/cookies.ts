type Cookie = { name: string; value: string };

/** A minimal stand-in for the framework's cookie store: one browser, one jar. */
class CookieJar {
  private cookies = new Map<string, string>();

  get(name: string): Cookie | undefined {
    const value = this.cookies.get(name);
    return value === undefined ? undefined : { name, value };
  }

  getAll(): Cookie[] {
    return [...this.cookies].map(([name, value]) => ({ name, value }));
  }

  has(name: string): boolean {
    return this.cookies.has(name);
  }

  set(nameOrCookie: string | (Cookie & { maxAge?: number }), value?: string, options?: { maxAge?: number }): this {
    const cookie = typeof nameOrCookie === "string" ? { name: nameOrCookie, value: value ?? "", maxAge: options?.maxAge } : nameOrCookie;
    if (cookie.maxAge === 0 || cookie.value === "") this.cookies.delete(cookie.name);
    else this.cookies.set(cookie.name, cookie.value);
    return this;
  }

  delete(name: string): this {
    this.cookies.delete(name);
    return this;
  }

  clear(): void {
    this.cookies.clear();
  }
}

export const cookieJar = new CookieJar();
