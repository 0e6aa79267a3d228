// What happens when an episode goes live: viewers whose requested upgrade is in it, and done
// (installed, both segments shot), are told; an upgrade shown unfinished tells nobody yet.
// Episodes and publishing call this inside their transaction, so the mails are queued exactly
// when the episode is committed live; the dedupe key makes it once per person per episode.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Build, Episode } from '../models';
import { config } from '../config';
import { enqueueMail } from '../mail/outbox';
import { upgradeLiveMail } from '../mail/templates';
import { unsubscribeToken } from './viewerPrivacy';

export async function notifyEpisodeLive(t: Transaction, buildId: number, episodeId: number): Promise<void> {
  const [build, episode] = await Promise.all([
    Build.findByPk(buildId, { transaction: t }),
    Episode.findOne({ where: { id: episodeId, buildId }, transaction: t }),
  ]);
  if (!build || !episode) return;
  const voters = await sequelize.query<{ email_hash: string; email: string; titles: string[] }>(
    `SELECT v.email_hash, min(v.email) AS email, array_agg(DISTINCT u.title ORDER BY u.title) AS titles
     FROM viewer_votes v
     JOIN viewer_requests r ON r.id = v.request_id
     JOIN upgrades u ON u.id = r.upgrade_id AND u.build_id = r.build_id
     WHERE r.build_id = :buildId AND r.state = 'accepted' AND u.episode_id = :episodeId
       AND u.install_state = 'installed' AND u.install_segment = 'shot' AND u.demo_segment = 'shot'
       AND v.confirmed_at IS NOT NULL AND v.email IS NOT NULL
       AND NOT EXISTS (SELECT 1 FROM unsubscribes s WHERE s.email_hash = v.email_hash)
     GROUP BY v.email_hash`,
    { replacements: { buildId, episodeId }, type: QueryTypes.SELECT, transaction: t },
  );
  const base = config().publicUrl;
  for (const v of voters) {
    const mail = upgradeLiveMail({
      buildName: build.name,
      episodeTitle: episode.title,
      episodeNumber: episode.number,
      upgradeTitles: v.titles,
      videoUrl: episode.videoUrl,
      pageUrl: `${base}/b/${build.slug}`,
      unsubscribeLink: `${base}/unsubscribe/${unsubscribeToken(v.email_hash)}`,
    });
    await enqueueMail(t, {
      kind: 'upgrade_live',
      to: v.email,
      subject: mail.subject,
      text: mail.text,
      headers: mail.headers,
      dedupeKey: `live:${episodeId}:${v.email_hash}`,
    });
  }
}
