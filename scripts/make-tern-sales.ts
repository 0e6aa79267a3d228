// Writes the invented store export of the "Project Tern" demo (server/db/seeders/data/project-tern-sales.csv):
// a few hundred order lines between the first live episode and the end of November, most tagged by the
// show-notes links, some untagged, some for other campaigns or other products, one refund and one line
// repeated. Deterministic (a fixed seed), so the file only changes when this script does.
// Run: npx tsx scripts/make-tern-sales.ts
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

// mulberry32: a small seeded generator, enough for invented demo data.
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = rng(20261008);
const pick = <T>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)]!;
const addDays = (d: string, n: number) => {
  const x = new Date(`${d}T00:00:00Z`);
  x.setUTCDate(x.getUTCDate() + n);
  return x.toISOString().slice(0, 10);
};

// Live episodes of the demo and the kits each shows (retail prices in whole dollars, from the demo data).
type Kit = readonly [string, number];
const EPISODES: { n: number; release: string; kits: readonly Kit[] }[] = [
  {
    n: 1,
    release: '2026-10-08',
    kits: [
      ['HT-LMP-4410-L', 689],
      ['HT-LMP-4410-R', 689],
      ['HT-HRN-2201', 119],
      ['HT-HU-9100', 1149],
      ['HT-BZL-9101', 149],
    ],
  },
  {
    n: 2,
    release: '2026-10-15',
    kits: [
      ['CR-ROOF-RAIL-BLK', 419],
      ['HT-XBR-6110', 279],
    ],
  },
  { n: 3, release: '2026-10-22', kits: [['HT-BMP-8100', 549]] },
  {
    n: 4,
    release: '2026-11-05',
    kits: [
      ['HT-RNB-6200', 629],
      ['HT-BRK-6201', 129],
      ['HT-HCH-8500', 469],
    ],
  },
  {
    n: 5,
    release: '2026-11-12',
    kits: [
      ['HT-CNS-9500', 115],
      ['HT-MIR-9600', 215],
      ['HT-HRN-9601', 45],
    ],
  },
];
const OTHER_PRODUCTS: readonly Kit[] = [
  ['CR-GIFT-50', 50],
  ['CR-DETAIL-KIT', 39],
  ['HT-FOG-5120', 329],
];
const LAST_DAY = '2026-11-30';
const STORE = 'https://shop.cedar-ridge.test/products/';

type Row = { order: string; line: number; at: string; sku: string; qty: number; total: string; landing: string };
const rows: Row[] = [];
let orderNo = 41_000;
const money = (cents: number) => (cents / 100).toFixed(2);
const time = () =>
  `${String(8 + Math.floor(rand() * 13)).padStart(2, '0')}:${String(Math.floor(rand() * 60)).padStart(2, '0')}:${String(Math.floor(rand() * 60)).padStart(2, '0')}`;

function order(at: string, items: Kit[], landing: string) {
  const id = `CR-${orderNo++}`;
  const clock = time();
  items.forEach(([sku, price], i) => {
    const qty = rand() < 0.12 ? 2 : 1;
    const discount = rand() < 0.2 ? 0.9 : 1;
    rows.push({
      order: id,
      line: i + 1,
      at: `${at} ${clock}`,
      sku,
      qty,
      total: money(Math.round(price * 100 * qty * discount)),
      landing,
    });
  });
  return id;
}
const tagged = (sku: string, n: number) =>
  `${STORE}${sku.toLowerCase()}?utm_source=youtube&utm_medium=video&utm_campaign=project-tern&utm_content=episode-${n}`;

for (const ep of EPISODES) {
  // Tagged orders: many in the first days after release, fewer later.
  const count = 15 + Math.floor(rand() * 6);
  for (let i = 0; i < count; i++) {
    const day = Math.floor(-Math.log(1 - rand() * 0.97) * 9);
    const at = addDays(ep.release, day);
    if (at > LAST_DAY) continue;
    const first = pick(ep.kits);
    const items =
      rand() < 0.25 ? [first, pick(ep.kits)].filter((x, j, xs) => xs.findIndex((y) => y[0] === x[0]) === j) : [first];
    order(at, items, tagged(first[0], ep.n));
  }
  // Untagged orders of the same kits within the window (assisted) and a few well after it.
  for (let i = 0; i < 8; i++) {
    const at = addDays(ep.release, Math.floor(rand() * 28));
    if (at > LAST_DAY) continue;
    order(at, [pick(ep.kits)], rand() < 0.5 ? '' : `${STORE}${pick(ep.kits)[0].toLowerCase()}`);
  }
}
// Not the series': another campaign, products that are not parts of the build, a kit of a later episode.
for (let i = 0; i < 70; i++) {
  const at = addDays('2026-10-08', Math.floor(rand() * 53));
  const kind = i % 3;
  if (kind === 0)
    order(
      at,
      [pick(EPISODES[0]!.kits)],
      `${STORE}ht-hu-9100?utm_source=newsletter&utm_medium=email&utm_campaign=winter-letter&utm_content=issue-4`,
    );
  else order(at, [pick(OTHER_PRODUCTS)], rand() < 0.5 ? '' : `${STORE}gifts`);
}

rows.sort((a, b) => (a.at < b.at ? -1 : a.at > b.at ? 1 : 0));
// One refund: the first head unit sold through episode 1 comes back three weeks later.
const sold = rows.find((r) => r.sku === 'HT-HU-9100' && r.landing.includes('episode-1'))!;
rows.push({
  ...sold,
  line: 90,
  at: `${addDays(sold.at.slice(0, 10), 21)} 10:15:00`,
  qty: -sold.qty,
  total: `-${sold.total}`,
});
// One line the store exported twice.
const again = rows[Math.floor(rows.length / 2)]!;
rows.push({ ...again });

const cell = (s: string | number) => (/[",\n]/.test(String(s)) ? `"${String(s).replace(/"/g, '""')}"` : String(s));
const text =
  [
    'Order Number,Line Item,Ordered At,Item SKU,Qty,Line Total,Currency,Landing Page',
    ...rows.map((r) => [r.order, r.line, r.at, r.sku, r.qty, r.total, 'USD', r.landing].map(cell).join(',')),
  ].join('\r\n') + '\r\n';
const out = path.join(path.dirname(fileURLToPath(import.meta.url)), '../server/db/seeders/data/project-tern-sales.csv');
fs.writeFileSync(out, text);
console.log(`${rows.length} lines → ${out}`);
