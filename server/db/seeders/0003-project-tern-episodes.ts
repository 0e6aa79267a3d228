// Episodes of the "Project Tern" demo series: five live, one in edit, one scheduled to shoot in the
// next days, drafts after it (prerequisites and parts dates respected), a few upgrades left unplanned
// so "Propose a plan" has something to place. Runs after 0002; demo mode only. Video URLs are invented.
import type { MigrationContext } from '../migrate';
import { Build, Episode, Upgrade } from '../../models';
import { TERN_BUILD, TERN_UPGRADES } from './data/project-tern';
import { addDays, todayIn } from '../../../shared/dates';

interface SeedEpisode {
  title: string;
  state: 'draft' | 'scheduled' | 'shot' | 'in_edit' | 'live';
  /** Fixed dates for what already happened; offsets in days from today for what is ahead. */
  shoot: string | number;
  release: string | number;
  runtime?: number;
  upgrades: string[];
}

const EPISODES: SeedEpisode[] = [
  {
    title: 'First light: projector headlamps and the big screen',
    state: 'live',
    shoot: '2026-10-01',
    release: '2026-10-08',
    runtime: 1460,
    upgrades: ['headlamps', 'headUnit'],
  },
  {
    title: 'Up top: roof rails and crossbars',
    state: 'live',
    shoot: '2026-10-07',
    release: '2026-10-15',
    runtime: 980,
    upgrades: ['roofRails', 'crossbars'],
  },
  {
    title: 'The bumper that makes radar possible',
    state: 'live',
    shoot: '2026-10-13',
    release: '2026-10-22',
    runtime: 1210,
    upgrades: ['rearBumper'],
  },
  {
    title: 'Step up and hitch up',
    state: 'live',
    shoot: '2026-10-28',
    release: '2026-11-05',
    runtime: 1330,
    upgrades: ['runningBoards', 'hitch'],
  },
  {
    title: 'Console and mirror swap',
    state: 'live',
    shoot: '2026-11-03',
    release: '2026-11-12',
    runtime: 890,
    upgrades: ['consoleTrim', 'autoDimMirror'],
  },
  {
    title: 'Behind the airbag, and radar that watches your back',
    state: 'in_edit',
    shoot: '2026-11-24',
    release: 4,
    upgrades: ['clockspring', 'blindSpot'],
  },
  {
    title: 'Ready to tow',
    state: 'scheduled',
    shoot: 2,
    release: 9,
    upgrades: ['trailerWiring', 'brakeController', 'wirelessCharging'],
  },
  { title: 'Warm hands, soft light', state: 'draft', shoot: 9, release: 16, upgrades: ['heatedWheel', 'ambient'] },
  {
    title: 'Twenty-inch stance',
    state: 'draft',
    shoot: 16,
    release: 23,
    upgrades: ['wheels20', 'tpms', 'skidPlate', 'mudFlaps'],
  },
  {
    title: 'Fog lamps and smarter wipers',
    state: 'draft',
    shoot: 23,
    release: 30,
    upgrades: ['lowerGrille', 'fogLamps', 'rainWipers'],
  },
  { title: 'Hands-free liftgate', state: 'draft', shoot: 30, release: 37, upgrades: ['powerLiftgate', 'tailLamps'] },
  {
    title: 'Folding mirrors and remote start',
    state: 'draft',
    shoot: 37,
    release: 44,
    upgrades: ['powerMirrors', 'remoteStart', 'inverter'],
  },
  { title: 'Seeing all the way round', state: 'draft', shoot: 44, release: 51, upgrades: ['surroundView'] },
];

/** A fixed date, or `v` days from today on the demo build's own clock. */
function dateOf(v: string | number): string {
  return typeof v === 'string' ? v : addDays(todayIn(TERN_BUILD.timeZone), v);
}

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  const build = await Build.findOne({ where: { slug: TERN_BUILD.slug } });
  if (!build || (await Episode.count({ where: { buildId: build.id } })) > 0) return;
  const upgrades = await Upgrade.findAll({ where: { buildId: build.id }, attributes: ['id', 'title'] });
  const idByTitle = new Map(upgrades.map((u) => [u.title, u.id]));
  const idOf = (key: string) => {
    const title = TERN_UPGRADES.find((u) => u.key === key)?.title;
    const id = title ? idByTitle.get(title) : undefined;
    if (!id) throw new Error(`seeder 0003: no demo upgrade "${key}"`);
    return id;
  };

  await sequelize.transaction(async (transaction) => {
    for (const [i, e] of EPISODES.entries()) {
      const shootDate = dateOf(e.shoot);
      let releaseDate = dateOf(e.release);
      if (releaseDate < shootDate) releaseDate = shootDate;
      const live = e.state === 'live';
      const ep = await Episode.create(
        {
          buildId: build.id,
          number: i + 1,
          title: e.title,
          summary: null,
          state: e.state,
          shootDate,
          releaseDate,
          videoUrl: live ? `https://video.example/tern-ep${i + 1}` : null,
          runtimeSeconds: e.runtime ?? null,
          publishedAt: live ? new Date(`${releaseDate}T16:00:00Z`) : null,
        },
        { transaction },
      );
      for (const [position, key] of e.upgrades.entries()) {
        await Upgrade.update(
          { episodeId: ep.id, episodePosition: position },
          { where: { id: idOf(key), buildId: build.id }, transaction },
        );
      }
    }
  });
}

export async function down() {}
