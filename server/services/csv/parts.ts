// Parts CSV: export every part of a build, and import rows as new parts on upgrades named by title.
import { sequelize, Build, Part, Upgrade } from '../../models';
import { record } from '../activity';
import { toPartRecord, type Person } from '../backlogRecords';
import { createPartSchema, type CreatePartInput } from '../../../shared/schemas/part';
import {
  blankToUndefined,
  centsToDollars,
  dollarsToCents,
  readCsv,
  rowProblems,
  toNumber,
  writeCsv,
  type ImportResult,
} from './common';
import { byLine } from './upgrades';

export const PART_COLUMNS = [
  'upgrade',
  'partNumber',
  'description',
  'quantity',
  'unitCost',
  'retailPrice',
  'supplier',
  'condition',
  'productUrl',
  'expectedArrival',
  'orderedOn',
  'receivedOn',
  'state',
] as const;
const REQUIRED = ['upgrade', 'partNumber', 'description'] as const;
const COLUMN_OF: Record<string, string> = {
  unitCostCents: 'unitCost',
  retailPriceCents: 'retailPrice',
  upgradeId: 'upgrade',
};
const MAX_ROWS = 5000;

export async function exportPartsCsv(build: Build) {
  const upgrades = await Upgrade.findAll({ where: { buildId: build.id }, attributes: ['id', 'title'] });
  const title = new Map(upgrades.map((u) => [u.id, u.title]));
  const parts = await Part.findAll({
    where: { buildId: build.id },
    order: [
      ['upgradeId', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  return writeCsv(
    PART_COLUMNS,
    parts.map((p) => ({
      upgrade: title.get(p.upgradeId) ?? '',
      partNumber: p.partNumber,
      description: p.description,
      quantity: p.quantity,
      unitCost: centsToDollars(p.unitCostCents),
      retailPrice: centsToDollars(p.retailPriceCents),
      supplier: p.supplier,
      condition: p.condition,
      productUrl: p.productUrl,
      expectedArrival: p.expectedArrival,
      orderedOn: p.orderedOn,
      receivedOn: p.receivedOn,
      state: p.state,
    })),
  );
}

export interface PartPreviewRow {
  line: number;
  upgradeTitle: string;
  part: CreatePartInput;
}

export async function importPartsCsv(
  actor: Person,
  build: Build,
  text: string,
  dryRun: boolean,
): Promise<ImportResult<PartPreviewRow>> {
  const { rows, errors } = readCsv(text, PART_COLUMNS, REQUIRED);
  if (rows.length > MAX_ROWS)
    errors.push({ line: MAX_ROWS + 2, field: '(row)', message: `at most ${MAX_ROWS} rows per file` });
  const upgrades = await Upgrade.findAll({ where: { buildId: build.id }, attributes: ['id', 'title'] });
  const byTitle = new Map<string, number[]>();
  for (const u of upgrades) byTitle.set(u.title, [...(byTitle.get(u.title) ?? []), u.id]);

  const preview: PartPreviewRow[] = [];
  for (const { line, cells } of rows) {
    const upgradeTitle = cells.upgrade ?? '';
    const matches = byTitle.get(upgradeTitle) ?? [];
    if (!upgradeTitle)
      errors.push({ line, field: 'upgrade', message: 'is required (the title of an upgrade of this build)' });
    else if (matches.length === 0)
      errors.push({ line, field: 'upgrade', message: `"${upgradeTitle}" is not an upgrade of this build` });
    else if (matches.length > 1)
      errors.push({
        line,
        field: 'upgrade',
        message: `"${upgradeTitle}" matches ${matches.length} upgrades; give them different titles first`,
      });
    const input = {
      upgradeId: matches.length === 1 ? matches[0] : 1,
      partNumber: cells.partNumber ?? '',
      description: cells.description ?? '',
      quantity: toNumber(cells.quantity),
      unitCostCents: dollarsToCents(cells.unitCost),
      retailPriceCents: dollarsToCents(cells.retailPrice),
      supplier: blankToUndefined(cells.supplier),
      condition: blankToUndefined(cells.condition),
      productUrl: blankToUndefined(cells.productUrl),
      expectedArrival: blankToUndefined(cells.expectedArrival),
      orderedOn: blankToUndefined(cells.orderedOn),
      receivedOn: blankToUndefined(cells.receivedOn),
      state: blankToUndefined(cells.state),
    };
    const parsed = createPartSchema.safeParse(input);
    if (!parsed.success) errors.push(...rowProblems(line, parsed.error, COLUMN_OF));
    preview.push({ line, upgradeTitle, part: parsed.success ? parsed.data : (input as never) });
  }

  errors.sort(byLine);
  if (errors.length || dryRun) return { ok: errors.length === 0, dryRun, rows: preview, errors };

  await sequelize.transaction(async (t) => {
    for (const row of preview) {
      const p = await Part.create(
        { ...(row.part as Required<CreatePartInput>), buildId: build.id },
        { transaction: t },
      );
      await record(t, {
        actor,
        buildId: build.id,
        entity: 'part',
        entityId: p.id,
        action: 'import',
        summary: `Imported part ${p.partNumber} for ${row.upgradeTitle} from CSV`,
        after: toPartRecord(p),
      });
    }
  });
  return { ok: true, dryRun, rows: preview, errors: [], created: preview.length };
}
