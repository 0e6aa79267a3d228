// Viewer requests of the "Project Tern" demo: a few invented requests with confirmed votes (names
// and addresses invented, at .test domains), one accepted and linked to a planned upgrade, and
// chapter marks for a live episode so its show notes are ready to paste. Demo mode only.
import type { MigrationContext } from '../migrate';
import { Build, Episode, EpisodeChapter, Upgrade, ViewerRequest, ViewerVote } from '../../models';
import { emailHash, newToken } from '../../services/viewerPrivacy';
import { TERN_BUILD, TERN_UPGRADES } from './data/project-tern';

const VOTERS = [
  { name: 'Dana P.', email: 'dana.p@viewers.test' },
  { name: 'Ole K.', email: 'ole.k@viewers.test' },
  { name: null, email: 'priya.n@viewers.test' },
  { name: 'Sam W.', email: 'sam.w@viewers.test' },
  { name: 'Jo R.', email: 'jo.r@viewers.test' },
];

const REQUESTS: { title: string; details: string | null; voters: number[]; accept?: string }[] = [
  {
    title: 'Heated steering wheel before winter',
    details: 'Cold mornings here. Would love to see the wheel swap, airbag steps and all.',
    voters: [0, 1, 2, 3],
    accept: 'heatedWheel',
  },
  {
    title: 'Puddle lamps in the side mirrors',
    details: 'The top trim lights the ground when you unlock. Is that a plug-in job?',
    voters: [1, 4, 2],
  },
  { title: 'Cargo management rails in the back', details: null, voters: [3, 0] },
  {
    title: 'Kick-to-open liftgate',
    details: 'Hands full of groceries, foot under the bumper, gate opens.',
    voters: [4],
  },
];

// Episode 3 of the demo ("The bumper that makes radar possible", 20:10 long).
const CHAPTERS = [
  { at: 0, title: 'Intro' },
  { at: 80, title: 'Why the stock cover cannot carry radar' },
  { at: 285, title: 'Taking the stock bumper cover off', upgrade: true },
  { at: 690, title: 'Fitting the cover with sensor mounts', upgrade: true },
  { at: 1090, title: 'Walkaround and what comes next' },
];

const keyId = async (buildId: number, key: string) => {
  const title = TERN_UPGRADES.find((u) => u.key === key)?.title;
  return title ? ((await Upgrade.findOne({ where: { buildId, title }, attributes: ['id'] }))?.id ?? null) : null;
};

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  const build = await Build.findOne({ where: { slug: TERN_BUILD.slug } });
  if (!build || (await ViewerRequest.count({ where: { buildId: build.id } })) > 0) return;
  await sequelize.transaction(async (transaction) => {
    const day = 86_400_000;
    for (const [i, r] of REQUESTS.entries()) {
      const createdAt = new Date(Date.now() - (20 - i * 3) * day);
      const upgradeId = r.accept ? await keyId(build.id, r.accept) : null;
      const req = await ViewerRequest.create(
        {
          buildId: build.id,
          title: r.title,
          details: r.details,
          state: upgradeId ? 'accepted' : 'new',
          upgradeId,
          confirmedAt: createdAt,
          createdAt,
        },
        { transaction },
      );
      for (const [k, v] of r.voters.entries()) {
        const voter = VOTERS[v]!;
        const at = new Date(createdAt.getTime() + k * day);
        await ViewerVote.create(
          {
            requestId: req.id,
            emailHash: emailHash(voter.email),
            emailSealed: null,
            email: voter.email,
            name: voter.name,
            confirmTokenHash: newToken().hash,
            expiresAt: at,
            confirmedAt: at,
            createdAt: at,
          },
          { transaction },
        );
      }
    }
    const episode = await Episode.findOne({ where: { buildId: build.id, number: 3 }, transaction });
    if (episode && (await EpisodeChapter.count({ where: { episodeId: episode.id }, transaction })) === 0) {
      const bumper = await keyId(build.id, 'rearBumper');
      await EpisodeChapter.bulkCreate(
        CHAPTERS.map((c, position) => ({
          episodeId: episode.id,
          position,
          startSeconds: c.at,
          title: c.title,
          upgradeId: c.upgrade ? bumper : null,
        })),
        { transaction },
      );
    }
  });
}

export async function down() {}
