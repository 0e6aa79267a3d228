// The invented "Project Tern" demo build (DESIGN §9): a 2019 Halvorsen Tern base trim turned into a
// top-trim showcase by Cedar Ridge Upfitters. Every name, part number, supplier and price is invented.
// Money here is in whole dollars for readability; the seeder turns it into cents.
import type { Area, Disposition, LabourKind, PartCondition, PartState, SafetyFlag } from '../../../../shared/domain';
import { FRONT_UPGRADES } from './project-tern-front';
import { SIDES_UPGRADES } from './project-tern-sides';
import { REAR_UPGRADES } from './project-tern-rear';
import { WHEELS_CHASSIS_UPGRADES } from './project-tern-wheels-chassis';
import { CABIN_UPGRADES } from './project-tern-cabin';
import { ELECTRICAL_UPGRADES } from './project-tern-electrical';

export const TERN_BUILD = {
  slug: 'project-tern',
  name: 'Project Tern',
  year: 2019,
  make: 'Halvorsen',
  model: 'Tern',
  trim: 'Base',
  // Check digit 5 at position 9 computed with shared/vin.ts (49 CFR 565 method); 'K' at position 10 = 2019.
  vin: '7HVTN2E55KC418206',
  mileage: 41_870,
  budgetCents: 3_800_000,
  labourRateCents: 9_500,
  shopHoursPerWeek: 24,
  shootHoursPerEpisode: 8,
  releaseCadenceDays: 7,
  startDate: '2026-09-22',
  timeZone: 'America/Denver',
  isPublic: true,
  campaign: 'project-tern',
  summary:
    'A base-trim 2019 Halvorsen Tern becomes a top-trim showcase, one factory-original upgrade at a time, filmed in the Cedar Ridge bay.',
};

/** done = installed and both segments shot; installed = installed, demo not shot yet. */
export type SeedStatus = 'done' | 'installed' | 'in_bay' | 'queued';

export interface SeedPart {
  pn: string;
  desc: string;
  qty?: number;
  cost: number;
  retail: number | null;
  supplier: string;
  condition?: PartCondition;
  state: PartState;
  expected?: string;
  ordered?: string;
  received?: string;
  url?: boolean;
}

export interface SeedRemoved {
  desc: string;
  pn?: string;
  disposition: Disposition;
  expected?: number;
  actual?: number;
  soldOn?: string;
}

export interface SeedUpgrade {
  key: string;
  title: string;
  area: Area;
  replaces: string | null;
  becomes: string | null;
  hours: number;
  value: number;
  priority: number;
  flags: SafetyFlag[];
  status: SeedStatus;
  installedOn?: string;
  needs?: string[];
  notes?: string;
  tireFrom?: string;
  tireTo?: string;
  parts: SeedPart[];
  removed?: SeedRemoved[];
}

/** Every upgrade, front to back then inside, in the order the seeder creates them. */
// One file per area of the vehicle, in the order the demo backlog lists them.
export const TERN_UPGRADES: SeedUpgrade[] = [
  ...FRONT_UPGRADES,
  ...SIDES_UPGRADES,
  ...REAR_UPGRADES,
  ...WHEELS_CHASSIS_UPGRADES,
  ...CABIN_UPGRADES,
  ...ELECTRICAL_UPGRADES,
];

export interface SeedLabour {
  upgrade: string;
  on: string;
  hours: number;
  kind: LabourKind;
  note?: string;
  /** 'installer' (default) or 'producer' (filming days). */
  by?: 'installer' | 'producer';
}

export const TERN_LABOUR: SeedLabour[] = [
  { upgrade: 'headUnit', on: '2026-09-24', hours: 1, kind: 'prep', note: 'Bench test before fitting' },
  { upgrade: 'headUnit', on: '2026-09-30', hours: 3.5, kind: 'install' },
  { upgrade: 'headUnit', on: '2026-10-01', hours: 1.5, kind: 'filming', by: 'producer' },
  { upgrade: 'headlamps', on: '2026-09-29', hours: 4, kind: 'install', note: 'Bumper cover off for lamp access' },
  { upgrade: 'headlamps', on: '2026-09-29', hours: 1, kind: 'filming', by: 'producer' },
  { upgrade: 'roofRails', on: '2026-10-06', hours: 2.5, kind: 'install' },
  { upgrade: 'crossbars', on: '2026-10-06', hours: 0.5, kind: 'install' },
  { upgrade: 'roofRails', on: '2026-10-07', hours: 1, kind: 'filming', by: 'producer' },
  { upgrade: 'rearBumper', on: '2026-10-09', hours: 1.5, kind: 'prep', note: 'Scuff and mask for paint' },
  { upgrade: 'rearBumper', on: '2026-10-13', hours: 4.5, kind: 'install' },
  { upgrade: 'runningBoards', on: '2026-10-20', hours: 3, kind: 'install' },
  { upgrade: 'runningBoards', on: '2026-10-21', hours: 1, kind: 'filming', by: 'producer' },
  { upgrade: 'hitch', on: '2026-10-27', hours: 2.5, kind: 'install' },
  { upgrade: 'hitch', on: '2026-10-28', hours: 0.5, kind: 'filming' },
  { upgrade: 'consoleTrim', on: '2026-11-03', hours: 1, kind: 'install' },
  { upgrade: 'autoDimMirror', on: '2026-11-03', hours: 1.5, kind: 'install' },
  {
    upgrade: 'clockspring',
    on: '2026-11-10',
    hours: 0.5,
    kind: 'prep',
    note: 'Battery disconnected, waited before airbag removal',
  },
  { upgrade: 'clockspring', on: '2026-11-10', hours: 1.5, kind: 'install' },
  { upgrade: 'blindSpot', on: '2026-11-17', hours: 3, kind: 'install' },
  { upgrade: 'blindSpot', on: '2026-11-24', hours: 2.5, kind: 'install', note: 'Radar calibration drive' },
  { upgrade: 'blindSpot', on: '2026-11-24', hours: 1, kind: 'filming', by: 'producer' },
  { upgrade: 'heatedWheel', on: '2026-11-27', hours: 1.5, kind: 'install' },
  { upgrade: 'trailerWiring', on: '2026-11-30', hours: 2, kind: 'install' },
];

export interface SeedExpense {
  upgrade?: string;
  on: string;
  amount: number;
  desc: string;
  category: string;
}

export const TERN_EXPENSES: SeedExpense[] = [
  { on: '2026-09-22', amount: 420, desc: 'Studio light rental, first month', category: 'filming' },
  { upgrade: 'headlamps', on: '2026-09-18', amount: 38, desc: 'Freight, headlamp assemblies', category: 'shipping' },
  { upgrade: 'rearBumper', on: '2026-10-08', amount: 65, desc: 'Masking film and scuff pads', category: 'consumables' },
  {
    upgrade: 'rearBumper',
    on: '2026-10-01',
    amount: 95,
    desc: 'Freight, bumper cover (oversize)',
    category: 'shipping',
  },
  { on: '2026-10-15', amount: 180, desc: 'Shop rags, cleaners, trim clips', category: 'consumables' },
  { upgrade: 'runningBoards', on: '2026-10-09', amount: 55, desc: 'Freight, running boards', category: 'shipping' },
  { on: '2026-10-22', amount: 420, desc: 'Studio light rental, second month', category: 'filming' },
  {
    upgrade: 'clockspring',
    on: '2026-11-10',
    amount: 24,
    desc: 'Single-use steering wheel bolt',
    category: 'consumables',
  },
  { upgrade: 'blindSpot', on: '2026-11-24', amount: 150, desc: 'Radar alignment target hire', category: 'tools' },
  { on: '2026-11-20', amount: 260, desc: 'Microphone windscreens and SD cards', category: 'filming' },
  { upgrade: 'wheels20', on: '2026-11-13', amount: 120, desc: 'Freight, wheel set', category: 'shipping' },
];

/** The store's product page for a part, invented domain (.test never resolves). */
export const productUrlFor = (pn: string) => `https://shop.cedar-ridge.test/parts/${pn.toLowerCase()}`;
