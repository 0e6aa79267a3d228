// Unit tests for shared/showNotes.ts: chapter times, chapter validation, tagged links and the assembled description.
import { describe, it, expect } from 'vitest';
import {
  formatChapterTime,
  parseChapterTime,
  validateChapters,
  tagProductUrl,
  slugify,
  buildShowNotes,
  type ShowNotesInput,
} from '../../shared/showNotes';
import { SAFETY_CAUTIONS, SAFETY_DEFERRAL } from '../../shared/safety';

// Sources for outside check values:
// C1: chapter-generator.com, "YouTube chapter format: the rules, with examples": long-video list uses
//     33:18 before the hour and 1:02:45, 1:34:20, 2:11:00 after it (m:ss below an hour, h:mm:ss from an hour).
// C2: support.vevo.com, "YouTube Chapters": example list "00:10 Music start", "01:54 …", "03:34 Credits"
//     (mm:ss with a leading zero); first timestamp must be 00:00, ascending order.
// C3: 9to5google.com, 2020-05-28, "YouTube video chapters": first timestamp 0:00, at least 3 chapters,
//     each 10 seconds or longer.
// C4: shopify.dev, Admin GraphQL "UTMParameters": the campaign parameters source, medium, campaign, content.

const TAGS = { source: 'youtube', medium: 'video', campaign: 'project-tern', content: 'episode-3' };

describe('formatChapterTime / parseChapterTime', () => {
  it.each([
    [0, '0:00'],
    [5, '0:05'],
    [65, '1:05'],
    [599, '9:59'],
    [1998, '33:18'], // C1: 33:18 (33 × 60 + 18 = 1998)
    [3599, '59:59'],
    [3600, '1:00:00'],
    [3765, '1:02:45'], // C1: 1:02:45
    [5660, '1:34:20'], // C1: 1:34:20
    [7860, '2:11:00'], // C1: 2:11:00
  ])('%i s ⇄ %s', (seconds, text) => {
    expect(formatChapterTime(seconds)).toBe(text);
    expect(parseChapterTime(text)).toBe(seconds);
  });

  it('reads mm:ss with a leading zero', () => {
    expect(parseChapterTime('00:10')).toBe(10); // C2: "00:10 Music start"
    expect(parseChapterTime('01:54')).toBe(114); // C2: "01:54"
    expect(parseChapterTime(' 03:34 ')).toBe(214); // C2: "03:34 Credits"
  });

  it('drops fractions and never throws on bad numbers', () => {
    expect(formatChapterTime(65.9)).toBe('1:05');
    expect(formatChapterTime(-3)).toBe('0:00');
    expect(formatChapterTime(Number.NaN)).toBe('0:00');
  });

  it.each(['', '5', '1:5', '1:60', '75:00', '1:2:03', '1:02:60', 'a:bc', '-1:00', '1:00:00:00', '1.5:00'])(
    'rejects %j',
    (text) => {
      expect(parseChapterTime(text)).toBeNull();
    },
  );
});

describe('validateChapters', () => {
  const good = [
    { startSeconds: 0, title: 'Intro' },
    { startSeconds: 95, title: 'Bumper off' },
    { startSeconds: 600, title: 'Radar working' },
  ];

  it('accepts a good list and an empty one', () => {
    expect(validateChapters(good, 900)).toEqual([]);
    expect(validateChapters(good, null)).toEqual([]);
    expect(validateChapters([], 900)).toEqual([]);
  });

  it('requires the first chapter at 0:00', () => {
    // C2, C3: the first timestamp must be 0:00.
    expect(validateChapters([{ startSeconds: 5, title: 'Intro' }], null)).toEqual([
      { index: 0, field: 'startSeconds', message: 'The first chapter must start at 0:00, not 0:05.' },
    ]);
  });

  it('requires strictly ascending times, naming both times', () => {
    const problems = validateChapters(
      [good[0]!, { startSeconds: 95, title: 'A' }, { startSeconds: 95, title: 'B' }, { startSeconds: 60, title: 'C' }],
      null,
    );
    expect(problems.map((p) => p.index)).toEqual([2, 3]);
    expect(problems[0]!.message).toContain('1:35');
    expect(problems[1]!.message).toMatch(/1:00.*1:35/);
  });

  it('keeps chapters inside the runtime', () => {
    const problems = validateChapters(good, 600); // last chapter starts exactly at the end
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ index: 2, field: 'startSeconds' });
    expect(problems[0]!.message).toContain('10:00');
  });

  it('requires a title of at most 100 characters', () => {
    const problems = validateChapters(
      [
        { startSeconds: 0, title: '   ' },
        { startSeconds: 30, title: 'x'.repeat(101) },
        { startSeconds: 60, title: 'y'.repeat(100) },
      ],
      null,
    );
    expect(problems).toEqual([
      { index: 0, field: 'title', message: 'A chapter title is required.' },
      { index: 1, field: 'title', message: 'Title is 101 characters; keep it to 100.' },
    ]);
  });

  it('rejects negative, fractional and missing start times without throwing', () => {
    const problems = validateChapters(
      [
        { startSeconds: 0, title: 'a' },
        { startSeconds: -1, title: 'b' },
        { startSeconds: 1.5, title: 'c' },
        { title: 'd' } as never,
      ],
      null,
    );
    expect(problems.map((p) => [p.index, p.field])).toEqual([
      [1, 'startSeconds'],
      [2, 'startSeconds'],
      [3, 'startSeconds'],
    ]);
  });
});

describe('tagProductUrl', () => {
  it('adds the four campaign parameters (C4) and keeps the rest of the link', () => {
    const out = tagProductUrl('https://shop.example/p/ht-4410?ref=abc#fitment', TAGS);
    expect(out).toBe(
      'https://shop.example/p/ht-4410?ref=abc&utm_source=youtube&utm_medium=video&utm_campaign=project-tern&utm_content=episode-3#fitment',
    );
    // Read back with the standard URL API, independently of how we built the string.
    const u = new URL(out!);
    expect(u.searchParams.get('ref')).toBe('abc');
    expect(u.searchParams.get('utm_campaign')).toBe('project-tern');
    expect(u.hash).toBe('#fitment');
  });

  it('replaces existing utm_* parameters (any case) and leaves other parameters byte for byte', () => {
    const out = tagProductUrl(
      'https://shop.example/p?variant&color=red%20blue&utm_source=old&UTM_Medium=x&utm_term=kit',
      TAGS,
    )!;
    expect(out.startsWith('https://shop.example/p?variant&color=red%20blue&utm_source=youtube')).toBe(true);
    const u = new URL(out);
    expect(u.searchParams.getAll('utm_source')).toEqual(['youtube']);
    expect(u.searchParams.has('UTM_Medium')).toBe(false);
    expect(u.searchParams.has('utm_term')).toBe(false);
    expect(u.searchParams.get('color')).toBe('red blue');
  });

  it('encodes values and skips empty ones', () => {
    const out = tagProductUrl('http://shop.example/', { ...TAGS, campaign: 'tern & co', content: ' ' })!;
    expect(out).toBe('http://shop.example/?utm_source=youtube&utm_medium=video&utm_campaign=tern%20%26%20co');
  });

  it.each(['ftp://shop.example/file', 'javascript:alert(1)', 'mailto:a@b.example', '/relative/path', 'not a url', ''])(
    'returns null for %j',
    (url) => {
      expect(tagProductUrl(url, TAGS)).toBeNull();
    },
  );
});

describe('slugify', () => {
  it('makes a campaign slug', () => {
    expect(slugify('Project Tern')).toBe('project-tern');
    expect(slugify('  Café  Build #2 ')).toBe('cafe-build-2');
    expect(slugify('project-tern')).toBe('project-tern');
  });
});

describe('buildShowNotes', () => {
  const input: ShowNotesInput = {
    title: 'Episode 3: Eyes in the back',
    summary: 'Blind-spot radar goes on, after the bumper cover that carries its mounts.',
    chapters: [
      { startSeconds: 0, title: 'Intro' },
      { startSeconds: 95, title: 'Bumper cover off' },
      { startSeconds: 1998, title: 'Radar working' },
    ],
    parts: [
      {
        partNumber: 'HT-4410',
        description: 'Rear bumper cover with sensor mounts',
        productUrl: 'https://shop.example/p/ht-4410?ref=abc',
        upgradeId: 1,
      },
      {
        partNumber: 'ht-4410',
        description: 'Rear bumper cover with sensor mounts',
        productUrl: 'https://shop.example/p/ht-4410?ref=abc',
        upgradeId: 1,
      },
      {
        partNumber: 'HT-5520',
        description: 'Blind-spot radar module',
        productUrl: 'https://shop.example/p/ht-5520',
        upgradeId: 2,
      },
    ],
    upgrades: [
      { id: 1, title: 'Rear bumper cover', safetyFlags: ['lifting'] },
      { id: 2, title: 'Blind-spot radar', safetyFlags: ['high_current', 'lifting'] },
    ],
    campaign: 'Project Tern',
    episodeNumber: 3,
    publicPageUrl: 'https://bayslate.example/b/project-tern',
  };
  const q = '?utm_source=youtube&utm_medium=video&utm_campaign=project-tern&utm_content=episode-3';
  const specific = (flag: 'lifting' | 'high_current') =>
    SAFETY_CAUTIONS[flag].caution.replace(SAFETY_DEFERRAL, '').trim();

  it('produces the full description in order, with no problems', () => {
    const { text, problems } = buildShowNotes(input);
    expect(problems).toEqual([]);
    expect(text).toBe(
      [
        'Episode 3: Eyes in the back',
        '',
        'Blind-spot radar goes on, after the bumper cover that carries its mounts.',
        '',
        'Chapters',
        '0:00 Intro',
        '1:35 Bumper cover off',
        '33:18 Radar working',
        '',
        'Parts in this episode',
        `- Rear bumper cover with sensor mounts (HT-4410): https://shop.example/p/ht-4410?ref=abc&${q.slice(1)}`,
        `- Blind-spot radar module (HT-5520): https://shop.example/p/ht-5520${q}`,
        '',
        'Safety',
        'This series shows work on one demonstration vehicle; it is not a repair manual.',
        `- High-current electrical (Blind-spot radar): ${specific('high_current')}`,
        `- Lifting the vehicle (Rear bumper cover, Blind-spot radar): ${specific('lifting')}`,
        SAFETY_DEFERRAL,
        '',
        'Which upgrade should we do next? Request it or vote for one at https://bayslate.example/b/project-tern',
      ].join('\n'),
    );
  });

  it('uses the given utm source and medium', () => {
    const { text } = buildShowNotes({ ...input, utmSource: 'newsletter', utmMedium: 'email' });
    expect(text).toContain('utm_source=newsletter&utm_medium=email&utm_campaign=project-tern&utm_content=episode-3');
  });

  it('lists problems but still produces text', () => {
    const { text, problems } = buildShowNotes({
      ...input,
      title: ' ',
      chapters: [
        { startSeconds: 4, title: 'Intro' },
        { startSeconds: 10, title: '' },
      ],
      parts: [
        { partNumber: 'HT-1', description: 'No link', productUrl: null, upgradeId: 1 },
        { partNumber: 'HT-2', description: 'Bad link', productUrl: 'ftp://x.example/a', upgradeId: 1 },
        { partNumber: 'HT-3', description: 'Other episode', productUrl: 'https://x.example/3', upgradeId: 99 },
        { partNumber: 'HT-4', description: 'Twice', productUrl: 'https://x.example/4a', upgradeId: 2 },
        { partNumber: 'HT-4', description: 'Twice', productUrl: 'https://x.example/4b', upgradeId: 2 },
      ],
      publicPageUrl: null,
      campaign: '',
    });
    expect(problems).toEqual(
      expect.arrayContaining([
        'The episode has no title.',
        'Chapter 1: The first chapter must start at 0:00, not 0:04.',
        'Chapter 2: A chapter title is required.',
        'Video platforms usually need at least 3 chapters before they show chapter markers.', // C3
        'Chapter 1 lasts under 10 seconds; video platforms may ignore the chapter list.', // C3: 4 s → 10 s is 6 s
        'Part HT-1 has no product page link.',
        'Part HT-2: the product link is not an http or https address and was left out.',
        'Part HT-3 belongs to an upgrade that is not in this episode and was left out.',
        'Part HT-4 is listed with two different product links; the first one is used.',
        'The build has no public page address, so the closing line has no link.',
        'The build has no campaign name, so product links carry no utm_campaign.',
      ]),
    );
    expect(text).toContain('- No link (HT-1)\n');
    expect(text).not.toContain('HT-3');
    expect(text).toContain('https://x.example/4a?utm_source=youtube&utm_medium=video&utm_content=episode-3');
    expect(text).not.toContain('4b');
    expect(text.endsWith('Tell us in the comments.')).toBe(true);
  });

  it('leaves out empty sections', () => {
    const { text } = buildShowNotes({ ...input, summary: null, chapters: [], parts: [], upgrades: [] });
    expect(text).toBe(
      'Episode 3: Eyes in the back\n\nWhich upgrade should we do next? Request it or vote for one at https://bayslate.example/b/project-tern',
    );
  });

  it('warns when the description is too long to paste', () => {
    const { problems } = buildShowNotes({ ...input, summary: 'z'.repeat(5200) });
    expect(problems.some((p) => /characters; video platforms commonly allow 5000/.test(p))).toBe(true);
  });
});
