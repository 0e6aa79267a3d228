// One error map for every shared schema: a problem says, in words, what is expected ("choose one
// of Front, Sides, …", "enter a number"), and `describeIssue` names the field in words first
// ("Area: choose one of Front, Sides, …"). Installed once, globally, by importing this module
// (shared/schemas/common.ts does), so the server, the forms and the CSV import all speak alike.
import { z } from 'zod';
import { AREA_LABELS, EPISODE_STATE_LABELS, INSTALL_STATE_LABELS, PART_STATE_LABELS } from '../domain';

/** Field names whose words are not just the name spelled out. */
const FIELD_WORDS: Record<string, string> = {
  vin: 'VIN',
  url: 'Address',
  videoUrl: 'Video address',
  productUrl: 'Product page address',
  downloadUrl: 'Download address',
  thumbUrl: 'Thumbnail address',
  email: 'E-mail',
  q: 'Search',
  isPublic: 'Public page',
  runtimeSeconds: 'Runtime',
  startSeconds: 'Start',
  upgradeIds: 'Upgrades',
  prerequisiteIds: 'Prerequisites',
  acceptDateChanges: 'Accepted date changes',
  basedOn: 'Plan version',
  overrideReason: 'Reason',
  intoId: 'Request to merge into',
  newUpgrade: 'New upgrade',
  tireFrom: 'Tire from',
  tireTo: 'Tire to',
  vinCheckOverridden: 'VIN check override',
  sizeBytes: 'File size',
  releaseCadenceDays: 'Days between releases',
  shopHoursPerWeek: 'Shop hours a week',
  shootHoursPerEpisode: 'Shoot hours an episode',
};

/** "unitCostCents" → "Unit cost", "upgradeId" → "Upgrade", "shootDate" → "Shoot date". */
export function fieldWords(key: string): string {
  if (FIELD_WORDS[key]) return FIELD_WORDS[key]!;
  const bare = key
    .replace(/Cents$/, '')
    .replace(/Id$/, '')
    .replace(/Ids$/, 's');
  const words = bare
    .replace(/_/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .trim();
  return words ? words[0]!.toUpperCase() + words.slice(1) : key;
}

/** A path in words: ["chapters", 2, "title"] → "Chapters, row 3: Title". */
export function fieldLabel(path: readonly PropertyKey[]): string {
  const named = path.filter((p) => typeof p === 'string') as string[];
  const rows = path.filter((p) => typeof p === 'number') as number[];
  if (!named.length) return rows.length ? `Row ${rows[0]! + 1}` : 'This form';
  const last = fieldWords(named[named.length - 1]!);
  if (!rows.length) return named.length > 1 ? `${fieldWords(named[0]!)}, ${last.toLowerCase()}` : last;
  return `${fieldWords(named[0]!)}, row ${rows[0]! + 1}${named.length > 1 ? `: ${last.toLowerCase()}` : ''}`;
}

const VALUE_WORDS: Record<string, string> = {
  ...AREA_LABELS,
  ...INSTALL_STATE_LABELS,
  ...PART_STATE_LABELS,
  ...EPISODE_STATE_LABELS,
};
/** A choice in words: "front" → "Front", "not_shot" → "Not shot". */
export function valueWords(v: unknown): string {
  const s = String(v);
  if (VALUE_WORDS[s]) return VALUE_WORDS[s]!;
  const w = s.replace(/_/g, ' ');
  return w ? w[0]!.toUpperCase() + w.slice(1) : s;
}

const TYPE_WORDS: Record<string, string> = {
  number: 'enter a number',
  int: 'enter a whole number',
  string: 'enter text',
  boolean: 'choose yes or no',
  array: 'give a list',
  object: 'give the fields of a record',
  date: 'enter a date',
};
const FORMAT_WORDS: Record<string, string> = {
  email: 'enter an e-mail address',
  url: 'enter a web address',
  date: 'enter a date as YYYY-MM-DD',
  datetime: 'enter a date and time',
  uuid: 'enter a valid identifier',
  regex: 'is not in the expected form',
};

type Issue = {
  code?: string;
  input?: unknown;
  expected?: string;
  values?: readonly unknown[];
  origin?: string;
  minimum?: number | bigint;
  maximum?: number | bigint;
  inclusive?: boolean;
  format?: string;
  keys?: readonly string[];
  divisor?: number;
};

function sizeWords(origin: string | undefined, n: number | bigint, small: boolean) {
  const num = Number(n);
  if (origin === 'string')
    return num <= 1 && small
      ? 'is required'
      : `${small ? 'at least' : 'at most'} ${num} character${num === 1 ? '' : 's'}`;
  if (origin === 'array' || origin === 'set')
    return `${small ? 'at least' : 'at most'} ${num} item${num === 1 ? '' : 's'}`;
  if (origin === 'file') return `${small ? 'at least' : 'at most'} ${num} bytes`;
  return `${small ? 'at least' : 'at most'} ${num}`;
}

/** What is expected, in words, for one zod issue (without the field's name). */
export function issueWords(iss: Issue): string {
  switch (iss.code) {
    case 'invalid_type':
      if (iss.input === undefined || iss.input === null) return 'is required';
      return TYPE_WORDS[iss.expected ?? ''] ?? 'has the wrong kind of value';
    case 'invalid_value': {
      const values = iss.values ?? [];
      if (values.length === 1) return `must be ${valueWords(values[0])}`;
      return `choose one of ${values.map(valueWords).join(', ')}`;
    }
    case 'too_small':
      return sizeWords(iss.origin, iss.minimum ?? 0, true);
    case 'too_big':
      return sizeWords(iss.origin, iss.maximum ?? 0, false);
    case 'invalid_format':
      return FORMAT_WORDS[iss.format ?? ''] ?? 'is not in the expected form';
    case 'not_multiple_of':
      return `must be a multiple of ${iss.divisor}`;
    case 'unrecognized_keys':
      return `is not something this form takes (${(iss.keys ?? []).join(', ')})`;
    case 'invalid_union':
      return 'is not a valid value here';
    case 'invalid_key':
    case 'invalid_element':
      return 'has a value that is not valid';
    default:
      return 'is not valid';
  }
}

/** "Area: choose one of Front, Sides, …" for one issue (or a path and a message). */
export function describeIssue(issue: { path: readonly PropertyKey[]; message: string }): string {
  return `${fieldLabel(issue.path)}: ${issue.message}`;
}

/** Text zod writes when no message was given; none of it may reach a person. */
export const RAW_SCHEMA_TEXT =
  /Invalid input|Invalid option|expected one of|received (string|number|undefined|object|boolean)|Too (small|big)|Unrecognized key/i;

let installed = false;
/** Makes `issueWords` the message of every issue a schema does not word itself. */
export function installErrorMap() {
  if (installed) return;
  installed = true;
  z.config({ customError: (iss) => issueWords(iss as unknown as Issue) });
}
installErrorMap();
