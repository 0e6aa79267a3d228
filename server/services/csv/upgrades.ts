// Backlog CSV: export every upgrade of a build, and import rows as new upgrades (all or nothing).
// Rows name each other through the `ref` column, so prerequisites survive export → import.
import { sequelize, Build, Upgrade, UpgradePrerequisite } from '../../models';
import { record } from '../activity';
import { prerequisiteMap, toUpgradeRecord, type Person } from '../backlogRecords';
import { createUpgradeSchema, type CreateUpgradeInput } from '../../../shared/schemas/upgrade';
import { findCycle } from '../../../shared/planner/criticalPath';
import {
  blankToUndefined,
  centsToDollars,
  dollarsToCents,
  readCsv,
  rowProblems,
  splitList,
  toNumber,
  writeCsv,
  type CsvProblem,
  type ImportResult,
} from './common';

export const UPGRADE_COLUMNS = [
  'ref',
  'title',
  'area',
  'replaces',
  'becomes',
  'estimatedHours',
  'valueAdded',
  'priority',
  'safetyFlags',
  'installState',
  'installSegment',
  'demoSegment',
  'installedOn',
  'notes',
  'tireFrom',
  'tireTo',
  'prerequisites',
] as const;
const REQUIRED = ['title', 'area'] as const;
const COLUMN_OF: Record<string, string> = { valueAddedCents: 'valueAdded' };
const MAX_ROWS = 2000;

export async function exportUpgradesCsv(build: Build) {
  const upgrades = await Upgrade.findAll({ where: { buildId: build.id }, order: [['id', 'ASC']] });
  const map = await prerequisiteMap(build.id);
  // Refs are positions, so exporting an imported copy gives the same text.
  const ref = new Map(upgrades.map((u, i) => [u.id, `U${i + 1}`]));
  return writeCsv(
    UPGRADE_COLUMNS,
    upgrades.map((u) => ({
      ref: ref.get(u.id)!,
      title: u.title,
      area: u.area,
      replaces: u.replaces,
      becomes: u.becomes,
      estimatedHours: u.estimatedHours,
      valueAdded: centsToDollars(u.valueAddedCents),
      priority: u.priority,
      safetyFlags: u.safetyFlags.join(';'),
      installState: u.installState,
      installSegment: u.installSegment,
      demoSegment: u.demoSegment,
      installedOn: u.installedOn,
      notes: u.notes,
      tireFrom: u.tireFrom,
      tireTo: u.tireTo,
      prerequisites: (map.get(u.id) ?? [])
        .sort((a, b) => a - b)
        .map((p) => ref.get(p)!)
        .join(';'),
    })),
  );
}

export interface UpgradePreviewRow {
  line: number;
  ref: string | null;
  upgrade: Omit<CreateUpgradeInput, 'prerequisiteIds'>;
  prerequisites: string[];
}

const rowSchema = createUpgradeSchema.omit({ prerequisiteIds: true, episodeId: true });

export async function importUpgradesCsv(
  actor: Person,
  build: Build,
  text: string,
  dryRun: boolean,
): Promise<ImportResult<UpgradePreviewRow>> {
  const { rows, errors } = readCsv(text, UPGRADE_COLUMNS, REQUIRED);
  if (rows.length > MAX_ROWS)
    errors.push({ line: MAX_ROWS + 2, field: '(row)', message: `at most ${MAX_ROWS} rows per file` });
  const preview: UpgradePreviewRow[] = [];
  const refs = new Map<string, number>(); // ref → index in preview
  for (const { line, cells } of rows) {
    const input = {
      title: cells.title ?? '',
      area: cells.area ?? '',
      replaces: blankToUndefined(cells.replaces),
      becomes: blankToUndefined(cells.becomes),
      estimatedHours: toNumber(cells.estimatedHours),
      valueAddedCents: dollarsToCents(cells.valueAdded),
      priority: toNumber(cells.priority),
      safetyFlags: cells.safetyFlags === undefined ? undefined : splitList(cells.safetyFlags),
      installState: blankToUndefined(cells.installState),
      installSegment: blankToUndefined(cells.installSegment),
      demoSegment: blankToUndefined(cells.demoSegment),
      installedOn: blankToUndefined(cells.installedOn),
      notes: blankToUndefined(cells.notes),
      tireFrom: blankToUndefined(cells.tireFrom),
      tireTo: blankToUndefined(cells.tireTo),
    };
    const parsed = rowSchema.safeParse(input);
    if (!parsed.success) errors.push(...rowProblems(line, parsed.error, COLUMN_OF));
    const ref = blankToUndefined(cells.ref) ?? null;
    if (ref !== null) {
      if (ref.length > 40) errors.push({ line, field: 'ref', message: 'must be at most 40 characters' });
      else if (refs.has(ref))
        errors.push({
          line,
          field: 'ref',
          message: `"${ref}" is already used on line ${preview[refs.get(ref)!]!.line}`,
        });
      else refs.set(ref, preview.length);
    }
    preview.push({
      line,
      ref,
      upgrade: parsed.success ? parsed.data : (input as never),
      prerequisites: splitList(cells.prerequisites),
    });
  }

  // Prerequisites name a ref in this file, or the exact title of an upgrade already in the build.
  const existing = await Upgrade.findAll({ where: { buildId: build.id }, attributes: ['id', 'title'] });
  const byTitle = new Map<string, number[]>();
  for (const u of existing) byTitle.set(u.title, [...(byTitle.get(u.title) ?? []), u.id]);
  const resolved = preview.map((row) => {
    const inFile: number[] = [];
    const inBuild: number[] = [];
    for (const p of row.prerequisites) {
      const i = refs.get(p);
      const titled = byTitle.get(p);
      if (i !== undefined) {
        if (preview[i] === row)
          errors.push({ line: row.line, field: 'prerequisites', message: 'an upgrade cannot need itself' });
        else inFile.push(i);
      } else if (titled?.length === 1) inBuild.push(titled[0]!);
      else if (titled && titled.length > 1)
        errors.push({
          line: row.line,
          field: 'prerequisites',
          message: `"${p}" matches ${titled.length} upgrades in this build; use a ref`,
        });
      else
        errors.push({
          line: row.line,
          field: 'prerequisites',
          message: `"${p}" is neither a ref in this file nor an upgrade of this build`,
        });
    }
    return { inFile: [...new Set(inFile)], inBuild: [...new Set(inBuild)] };
  });
  // Existing upgrades never depend on new rows, so a loop can only run through the file's own rows.
  const cycle = findCycle(
    preview.map((_, i) => i),
    resolved.flatMap((r, i) => r.inFile.map((p) => [p, i] as [number, number])),
  );
  if (cycle) {
    const names = cycle.map((i) => preview[i]!.upgrade.title);
    errors.push({
      line: preview[cycle[0]!]!.line,
      field: 'prerequisites',
      message: `rows form a loop: ${[...names, names[0]].join(' → ')}`,
    });
  }

  errors.sort(byLine);
  if (errors.length || dryRun) return { ok: errors.length === 0, dryRun, rows: preview, errors };

  await sequelize.transaction(async (t) => {
    const ids: number[] = [];
    for (const row of preview) {
      const u = await Upgrade.create(
        { ...(row.upgrade as Required<typeof row.upgrade>), buildId: build.id },
        { transaction: t },
      );
      ids.push(u.id);
    }
    const links = resolved.flatMap((r, i) => [
      ...r.inFile.map((p) => ({ buildId: build.id, upgradeId: ids[i]!, prerequisiteId: ids[p]! })),
      ...r.inBuild.map((p) => ({ buildId: build.id, upgradeId: ids[i]!, prerequisiteId: p })),
    ]);
    if (links.length) await UpgradePrerequisite.bulkCreate(links, { transaction: t });
    const created = await Upgrade.findAll({ where: { id: ids }, transaction: t });
    const pre = await prerequisiteMap(build.id, t, ids);
    for (const u of created) {
      await record(t, {
        actor,
        buildId: build.id,
        entity: 'upgrade',
        entityId: u.id,
        action: 'import',
        summary: `Imported upgrade ${u.title} from CSV`,
        after: toUpgradeRecord(u, pre.get(u.id) ?? []),
      });
    }
  });
  return { ok: true, dryRun, rows: preview, errors: [], created: preview.length };
}

export const byLine = (a: CsvProblem, b: CsvProblem) => a.line - b.line;
