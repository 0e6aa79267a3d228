// Kit sales of the "Project Tern" demo: the store's invented order export (data/project-tern-sales.csv,
// made by scripts/make-tern-sales.ts) imported through the same import the Sales screen uses, so the
// screen has something to show. The store sells the roof rails under its own code, which the part
// records as its store SKU. Runs after 0003 (episodes); demo mode only; a second run adds nothing.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { MigrationContext } from '../migrate';
import { Build, Part, User } from '../../models';
import { importSales } from '../../services/salesImport';
import { TERN_BUILD } from './data/project-tern';

const here = path.dirname(fileURLToPath(import.meta.url));
export const TERN_SALES_FILE = path.join(here, 'data/project-tern-sales.csv');
export const TERN_SALES_MAPPING = {
  orderId: 'Order Number',
  lineId: 'Line Item',
  date: 'Ordered At',
  sku: 'Item SKU',
  quantity: 'Qty',
  revenue: 'Line Total',
  currency: 'Currency',
  landingUrl: 'Landing Page',
};

export async function up(_ctx: { context: MigrationContext }) {
  const build = await Build.findOne({ where: { slug: TERN_BUILD.slug } });
  const owner = await User.findOne({ where: { email: 'owner@cedar-ridge.test' } });
  if (!build || !owner) return;
  await Part.update({ storeSku: 'CR-ROOF-RAIL-BLK' }, { where: { buildId: build.id, partNumber: 'HT-RRL-6100' } });
  const report = await importSales(owner, build, fs.readFileSync(TERN_SALES_FILE, 'utf8'), {
    dryRun: false,
    mapping: TERN_SALES_MAPPING,
    fileName: 'project-tern-sales.csv',
  });
  if (!report.ok)
    throw new Error(`seeder 0006: the demo sales export has problems: ${JSON.stringify(report.errors.slice(0, 5))}`);
}

export async function down() {}
