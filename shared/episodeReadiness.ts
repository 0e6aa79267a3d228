// Whether an episode may go live: every upgrade it shows is done (installed, install and demo
// segments shot). The server enforces it; the publish screen shows the same list before the button.
import { INSTALL_STATE_LABELS, type InstallState, type SegmentState } from './domain';

export interface ReadinessUpgrade {
  id: number;
  title: string;
  installState: InstallState;
  installSegment: SegmentState;
  demoSegment: SegmentState;
}

export interface UnfinishedUpgrade {
  id: number;
  title: string;
  /** What is missing, in words: "not installed (Queued)", "install segment not shot", … */
  lacks: string[];
}

export function whatItLacks(u: ReadinessUpgrade): string[] {
  const out: string[] = [];
  if (u.installState !== 'installed')
    out.push(`not installed (${INSTALL_STATE_LABELS[u.installState] ?? u.installState})`);
  if (u.installSegment !== 'shot') out.push('install segment not shot');
  if (u.demoSegment !== 'shot') out.push('demo segment not shot');
  return out;
}

export function unfinishedOf(upgrades: readonly ReadinessUpgrade[]): UnfinishedUpgrade[] {
  return upgrades.map((u) => ({ id: u.id, title: u.title, lacks: whatItLacks(u) })).filter((u) => u.lacks.length > 0);
}

/** One sentence naming each unfinished upgrade and what it lacks. */
export function describeUnfinished(list: readonly UnfinishedUpgrade[]): string {
  return list.map((u) => `${u.title}: ${u.lacks.join(', ')}`).join('; ');
}
