// The WHATWG URL parser, which browsers and Node both provide. Its type comes from the DOM or the
// Node type libraries, and shared/ is compiled with neither (tsconfig.shared.json), so shared/
// reaches it through this one typed door.
export interface WebUrl {
  protocol: string;
  hostname: string;
  pathname: string;
  search: string;
  hash: string;
  href: string;
  toString(): string;
}

const WebUrlClass = (globalThis as unknown as { URL: new (url: string) => WebUrl }).URL;

/** Parses an absolute address; throws on anything that is not one (as `new URL` does). */
export function parseUrl(url: string): WebUrl {
  return new WebUrlClass(url);
}
