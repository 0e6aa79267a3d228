// The words of the daily slip digest to producers: which releases are at risk and why.
import type { EpisodeSlip } from '../../shared/planner/slips';

export function slipDigestMail(p: {
  buildName: string;
  day: string;
  slips: EpisodeSlip[];
  overdue: { partNumber: string; description: string; upgradeTitle: string; expectedArrival: string }[];
  plannerUrl: string;
}) {
  const lines: string[] = [];
  for (const s of p.slips) {
    const c = s.cause!;
    lines.push(
      `  - Episode ${s.number}, ${s.title}: shoot ${s.planned.shootDate} → ${s.projected.shootDate}, release ${s.planned.releaseDate ?? 'not set'} → ${s.projected.releaseDate ?? 'not set'} (${s.partsDelayDays} day${s.partsDelayDays === 1 ? '' : 's'} later).` +
        ` Waiting on ${c.partNumber} (${c.description}) for ${c.upgradeTitle}, ${c.overdue ? `overdue since ${c.expectedArrival}` : `due ${c.expectedArrival}`}.`,
    );
  }
  const overdue = p.overdue.map(
    (o) => `  - ${o.partNumber} (${o.description}) for ${o.upgradeTitle}: expected ${o.expectedArrival}, not received.`,
  );
  return {
    subject: `${p.buildName}: ${p.slips.length} release${p.slips.length === 1 ? '' : 's'} at risk (${p.day})`.slice(
      0,
      300,
    ),
    text:
      `Parts have moved on the ${p.buildName} build. As of ${p.day}:\n\n` +
      (lines.length ? `Releases at risk:\n${lines.join('\n')}\n\n` : 'No release is at risk.\n\n') +
      (overdue.length ? `Overdue parts:\n${overdue.join('\n')}\n\n` : '') +
      `Open the planner to move episodes or chase the parts:\n${p.plannerUrl}\n\n` +
      `You get at most one of these a day for each build.\n\n— Bayslate, for the build crew`,
  };
}
