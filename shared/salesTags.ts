// Campaign tags of a sale: utm_campaign / utm_content read from a landing address, and the episode
// number a content tag names. Pure TypeScript (no DOM or Node URL types: see webUrl.ts).
import { parseUrl, type WebUrl } from './webUrl';

/** 'episode-12' → 12 (the utm_content that shared/showNotes.ts writes); anything else → null. */
export function episodeNumberOf(content: string | null | undefined): number | null {
  const m = /^episode-(\d{1,6})$/i.exec((content ?? '').trim());
  return m ? Number(m[1]) : null;
}

/** The query of an address as a map (first value of each name wins), decoded as forms encode it. */
function queryParams(search: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const pair of search.replace(/^\?/, '').split('&')) {
    if (!pair) continue;
    const eq = pair.indexOf('=');
    const decode = (x: string) => {
      try {
        return decodeURIComponent(x.replace(/\+/g, ' '));
      } catch {
        return x;
      }
    };
    const name = decode(eq < 0 ? pair : pair.slice(0, eq));
    if (!out.has(name)) out.set(name, decode(eq < 0 ? '' : pair.slice(eq + 1)));
  }
  return out;
}

/** utm_campaign and utm_content of a landing page address (absolute or a path); blank when absent. */
export function tagsOfUrl(url: string | null | undefined): { campaign: string | null; content: string | null } {
  const t = (url ?? '').trim();
  if (!t) return { campaign: null, content: null };
  let u: WebUrl;
  try {
    u = parseUrl(/^[a-z][a-z0-9+.-]*:/i.test(t) ? t : `https://store.invalid${t.startsWith('/') ? '' : '/'}${t}`);
  } catch {
    return { campaign: null, content: null };
  }
  const params = queryParams(u.search);
  const v = (k: string) => params.get(k)?.trim() || null;
  return { campaign: v('utm_campaign'), content: v('utm_content') };
}
