// What happens when an episode goes live: viewers whose requested upgrade is in it are told.
// The viewer-requests feature implements the mail; episodes call this inside their transaction.
import type { Transaction } from 'sequelize';

export async function notifyEpisodeLive(_t: Transaction, _buildId: number, _episodeId: number): Promise<void> {
  // Filled in by the viewer-requests feature (mail queue).
}
