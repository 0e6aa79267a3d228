// The words of Bayslate's mails, as plain text (no HTML: nothing a viewer typed can become markup).
import { config } from '../config';

const sign = '\n\n— Bayslate, for the build crew';

/**
 * A viewer's words as one quoted line of a plain-text mail: no line breaks or control and
 * direction characters (they could fake a paragraph from the shop), and web addresses broken so
 * mail programs do not turn them into links.
 */
export function quoteViewerText(s: string, max = 200): string {
  const flat = s
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029\u200e\u200f\u202a-\u202e\u2066-\u2069]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim()
    .slice(0, max)
    .replace(/:\/\//g, '[:]//')
    .replace(/\bwww\./gi, (m) => `${m.slice(0, 3)}[.]`);
  return `“${flat}”`;
}

export function confirmVoteMail(p: {
  buildName: string;
  requestTitle: string;
  link: string;
  hours: number;
  isNewRequest: boolean;
}) {
  return {
    // Fixed words and the shop's own build name only: a stranger's text never reaches the subject.
    subject: `Confirm your vote on the ${p.buildName} build`.slice(0, 300),
    text:
      `Someone (hopefully you) ${p.isNewRequest ? 'asked for' : 'voted for'} this upgrade on the ${p.buildName} build page:\n\n` +
      `  ${quoteViewerText(p.requestTitle)}\n\n` +
      `To count your vote, open this link within ${p.hours} hours:\n\n${p.link}\n\n` +
      `If it was not you, ignore this mail: nothing is counted and your address is not kept.` +
      sign,
  };
}

export function upgradeLiveMail(p: {
  buildName: string;
  episodeTitle: string;
  episodeNumber: number;
  upgradeTitles: string[];
  videoUrl: string | null;
  pageUrl: string;
  unsubscribeLink: string;
}) {
  const watch = p.videoUrl ? `Watch it here:\n${p.videoUrl}\n\n` : '';
  return {
    subject: `It is live: ${p.upgradeTitles.join(', ')}`.slice(0, 300),
    text:
      `You voted for an upgrade on the ${p.buildName} build, and the episode that shows it is now live.\n\n` +
      `Episode ${p.episodeNumber}: ${p.episodeTitle}\n` +
      p.upgradeTitles.map((t) => `  - ${t}\n`).join('') +
      `\n${watch}` +
      `See what else is planned, and vote for what comes next:\n${p.pageUrl}\n\n` +
      `No more of these mails: ${p.unsubscribeLink}` +
      sign,
    headers: { 'List-Unsubscribe': `<${p.unsubscribeLink}>` },
  };
}

export function invitationMail(p: { name: string; roles: string[]; invitedBy: string | null; link: string }) {
  const url = `${config().publicUrl}/sign-in`;
  return {
    subject: 'You have a Bayslate account',
    text:
      `Hello ${p.name},\n\n` +
      `${p.invitedBy ?? 'The shop owner'} added you to Bayslate as ${p.roles.join(', ')}.\n\n` +
      `Choose your password here (the link works once, for 7 days):\n${p.link}\n\n` +
      `Then sign in with this e-mail address at:\n${url}\n\n` +
      `No password is ever sent by mail. If ${p.invitedBy ?? 'the owner'} gave you a temporary one in person, it works too; change it under "My account".` +
      sign,
  };
}
