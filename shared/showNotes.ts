// Show notes for an episode: chapter times, tagged product links, safety cautions, as paste-ready plain text.
// Pure TypeScript (uses only the standard URL API, present in browsers and Node alike).
import { cautionsFor, SAFETY_DEFERRAL } from './safety';
import { parseUrl, type WebUrl } from './webUrl';

export interface ChapterInput {
  startSeconds: number;
  title: string;
}

export interface ChapterProblem {
  index: number;
  field: 'startSeconds' | 'title';
  message: string;
}

export const MAX_CHAPTER_TITLE = 100;

// Video platforms only turn a timestamp list into chapter markers when it has at least three
// entries, each lasting 10 seconds or more (YouTube's announcement as reported by 9to5google,
// 2020-05-28). We report these as advice in the show notes, not as errors in the chapter list.
export const PLATFORM_MIN_CHAPTERS = 3;
export const PLATFORM_MIN_CHAPTER_SECONDS = 10;
// From memory: YouTube caps a video description at 5,000 characters.
export const PLATFORM_MAX_DESCRIPTION = 5000;

const pad2 = (n: number) => String(n).padStart(2, '0');

/** 65 → '1:05'; 3725 → '1:02:05'. Fractions are dropped and negatives shown as 0:00, never thrown on. */
export function formatChapterTime(seconds: number): string {
  const total = Number.isFinite(seconds) && seconds > 0 ? Math.floor(seconds) : 0;
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  return h > 0 ? `${h}:${pad2(m)}:${pad2(s)}` : `${m}:${pad2(s)}`;
}

/** Accepts m:ss, mm:ss and h:mm:ss (minutes and seconds 00–59); returns seconds, or null when unreadable. */
export function parseChapterTime(text: string): number | null {
  const t = String(text ?? '').trim();
  let m = /^(\d{1,2}):([0-5]\d)$/.exec(t);
  if (m) {
    const min = Number(m[1]);
    // 75:00 is ambiguous next to 1:15:00; insisting on h:mm:ss past the hour keeps one spelling per time.
    return min > 59 ? null : min * 60 + Number(m[2]);
  }
  m = /^(\d{1,2}):([0-5]\d):([0-5]\d)$/.exec(t);
  if (m) return Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3]);
  return null;
}

/** Every problem in a chapter list; [] means it is ready. An empty list is allowed (no chapters). */
export function validateChapters(chapters: readonly ChapterInput[], runtimeSeconds: number | null): ChapterProblem[] {
  const problems: ChapterProblem[] = [];
  const runtime =
    runtimeSeconds !== null && Number.isFinite(runtimeSeconds) && runtimeSeconds > 0 ? runtimeSeconds : null;
  let previous: number | null = null;

  chapters.forEach((ch, index) => {
    const start = ch?.startSeconds;
    if (typeof start !== 'number' || !Number.isInteger(start) || start < 0) {
      problems.push({
        index,
        field: 'startSeconds',
        message: 'Start time must be a whole number of seconds, 0:00 or later.',
      });
    } else {
      if (index === 0 && start !== 0) {
        problems.push({
          index,
          field: 'startSeconds',
          message: `The first chapter must start at 0:00, not ${formatChapterTime(start)}.`,
        });
      }
      if (index > 0 && previous !== null && start <= previous) {
        problems.push({
          index,
          field: 'startSeconds',
          message: `Starts at ${formatChapterTime(start)}, which is not after the chapter before it (${formatChapterTime(previous)}); chapters must go in order.`,
        });
      }
      if (runtime !== null && start >= runtime) {
        problems.push({
          index,
          field: 'startSeconds',
          message: `Starts at ${formatChapterTime(start)}, at or past the end of the video (${formatChapterTime(runtime)}).`,
        });
      }
      previous = start;
    }

    const title = typeof ch?.title === 'string' ? ch.title.trim() : '';
    if (!title) {
      problems.push({ index, field: 'title', message: 'A chapter title is required.' });
    } else if (title.length > MAX_CHAPTER_TITLE) {
      problems.push({
        index,
        field: 'title',
        message: `Title is ${title.length} characters; keep it to ${MAX_CHAPTER_TITLE}.`,
      });
    }
  });
  return problems;
}

export interface UtmTags {
  source: string;
  medium: string;
  campaign: string;
  content: string;
}

/**
 * Add campaign parameters to a product link. Other query parameters are kept exactly as written
 * (we splice the raw query instead of re-serialising it, so '?variant' does not become '?variant=');
 * any utm_* already present is replaced. Only http and https links are tagged; anything else → null.
 */
export function tagProductUrl(url: string, tags: UtmTags): string | null {
  let u: WebUrl;
  try {
    u = parseUrl(String(url ?? '').trim());
  } catch {
    return null;
  }
  if (u.protocol !== 'http:' && u.protocol !== 'https:') return null;

  const keyOf = (pair: string) => {
    const raw = pair.split('=')[0] ?? '';
    try {
      return decodeURIComponent(raw.replace(/\+/g, ' '));
    } catch {
      return raw;
    }
  };
  const kept = u.search
    .replace(/^\?/, '')
    .split('&')
    .filter((p) => p !== '' && !/^utm_/i.test(keyOf(p)));
  const added = (
    [
      ['utm_source', tags.source],
      ['utm_medium', tags.medium],
      ['utm_campaign', tags.campaign],
      ['utm_content', tags.content],
    ] as const
  )
    .filter(([, v]) => typeof v === 'string' && v.trim() !== '')
    .map(([k, v]) => `${k}=${encodeURIComponent(v.trim())}`);
  u.search = [...kept, ...added].join('&');
  return u.toString();
}

/** 'Project Tern' → 'project-tern': lower case, ASCII letters and digits, single dashes. */
export function slugify(text: string): string {
  return String(text ?? '')
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
}

export interface ShowNotesPart {
  partNumber: string;
  description: string;
  productUrl: string | null;
  upgradeId: number;
}

export interface ShowNotesUpgrade {
  id: number;
  title: string;
  safetyFlags: readonly string[];
}

export interface ShowNotesInput {
  title: string;
  summary?: string | null;
  chapters: readonly ChapterInput[];
  parts: readonly ShowNotesPart[];
  upgrades: readonly ShowNotesUpgrade[];
  /** The build's campaign; slugified for utm_campaign. */
  campaign: string;
  episodeNumber: number;
  publicPageUrl: string | null;
  /** Defaults describe where the link sits: a video platform's description box. */
  utmSource?: string;
  utmMedium?: string;
  runtimeSeconds?: number | null;
}

export interface ShowNotes {
  text: string;
  /** Things to fix or know before publishing; the text is still produced when there are some. */
  problems: string[];
}

function isWebUrl(url: string | null | undefined): url is string {
  if (!url) return false;
  try {
    const u = parseUrl(url.trim());
    return u.protocol === 'http:' || u.protocol === 'https:';
  } catch {
    return false;
  }
}

/** Build a plain-text video description ready to paste. */
export function buildShowNotes(input: ShowNotesInput): ShowNotes {
  const problems: string[] = [];
  const sections: string[] = [];

  const title = (input.title ?? '').trim();
  if (!title) problems.push('The episode has no title.');
  const head = [title, (input.summary ?? '').trim()].filter(Boolean).join('\n\n');
  if (head) sections.push(head);

  // Chapters, in the order given: the validator says what is wrong rather than silently re-sorting.
  const chapters = input.chapters ?? [];
  for (const p of validateChapters(chapters, input.runtimeSeconds ?? null)) {
    problems.push(`Chapter ${p.index + 1}: ${p.message}`);
  }
  if (chapters.length > 0) {
    if (chapters.length < PLATFORM_MIN_CHAPTERS) {
      problems.push(
        `Video platforms usually need at least ${PLATFORM_MIN_CHAPTERS} chapters before they show chapter markers.`,
      );
    }
    chapters.forEach((ch, i) => {
      const next = i + 1 < chapters.length ? chapters[i + 1]!.startSeconds : (input.runtimeSeconds ?? null);
      if (next !== null && next > ch.startSeconds && next - ch.startSeconds < PLATFORM_MIN_CHAPTER_SECONDS) {
        problems.push(
          `Chapter ${i + 1} lasts under ${PLATFORM_MIN_CHAPTER_SECONDS} seconds; video platforms may ignore the chapter list.`,
        );
      }
    });
    sections.push(
      [
        'Chapters',
        ...chapters.map((c) => `${formatChapterTime(c.startSeconds)} ${(c.title ?? '').trim()}`.trimEnd()),
      ].join('\n'),
    );
  }

  // Parts: each part number once (first wins), only for upgrades shown in this episode.
  const upgradeIds = new Set(input.upgrades.map((u) => u.id));
  const campaign = slugify(input.campaign);
  if (!campaign) problems.push('The build has no campaign name, so product links carry no utm_campaign.');
  const tags: UtmTags = {
    source: input.utmSource?.trim() || 'youtube',
    medium: input.utmMedium?.trim() || 'video',
    campaign,
    content: `episode-${input.episodeNumber}`,
  };
  if (!Number.isInteger(input.episodeNumber) || input.episodeNumber < 1) {
    problems.push(`Episode number "${input.episodeNumber}" is not a positive whole number.`);
  }
  const seen = new Map<string, string | null>();
  const partLines: string[] = [];
  for (const part of input.parts) {
    const pn = (part.partNumber ?? '').trim();
    const key = pn.toUpperCase();
    if (!pn) {
      problems.push(`A part ("${part.description}") has no part number and was left out.`);
      continue;
    }
    if (upgradeIds.size > 0 && !upgradeIds.has(part.upgradeId)) {
      problems.push(`Part ${pn} belongs to an upgrade that is not in this episode and was left out.`);
      continue;
    }
    const url = part.productUrl?.trim() || null;
    if (seen.has(key)) {
      if (url && seen.get(key) && seen.get(key) !== url) {
        problems.push(`Part ${pn} is listed with two different product links; the first one is used.`);
      }
      continue;
    }
    seen.set(key, url);
    const label = `- ${(part.description ?? '').trim() || pn} (${pn})`;
    if (!url) {
      problems.push(`Part ${pn} has no product page link.`);
      partLines.push(label);
    } else {
      const tagged = tagProductUrl(url, tags);
      if (!tagged) problems.push(`Part ${pn}: the product link is not an http or https address and was left out.`);
      partLines.push(tagged ? `${label}: ${tagged}` : label);
    }
  }
  if (partLines.length > 0) sections.push(['Parts in this episode', ...partLines].join('\n'));

  // Safety: one line per flag, naming the upgrades in this episode that carry it. The shared
  // deferral closes every caution; in a description it is said once, after the list, not per line.
  const allFlags = input.upgrades.flatMap((u) => [...(u.safetyFlags ?? [])]);
  const cautions = cautionsFor(allFlags);
  if (cautions.length > 0) {
    const lines = cautions.map((c) => {
      const which = input.upgrades.filter((u) => (u.safetyFlags ?? []).includes(c.flag)).map((u) => u.title.trim());
      return `- ${c.label} (${which.join(', ')}): ${c.caution.replace(SAFETY_DEFERRAL, '').trim()}`;
    });
    sections.push(
      [
        'Safety',
        'This series shows work on one demonstration vehicle; it is not a repair manual.',
        ...lines,
        SAFETY_DEFERRAL,
      ].join('\n'),
    );
  }

  const page = input.publicPageUrl?.trim() ?? '';
  if (isWebUrl(page)) {
    sections.push(`Which upgrade should we do next? Request it or vote for one at ${page}`);
  } else {
    problems.push('The build has no public page address, so the closing line has no link.');
    sections.push('Which upgrade should we do next? Tell us in the comments.');
  }

  const text = sections.join('\n\n');
  if (text.length > PLATFORM_MAX_DESCRIPTION) {
    problems.push(
      `The description is ${text.length} characters; video platforms commonly allow ${PLATFORM_MAX_DESCRIPTION}.`,
    );
  }
  return { text, problems };
}
