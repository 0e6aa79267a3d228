// Confirmed viewer votes per upgrade, which the planner counts as priority.
// The viewer-requests feature implements it.
export async function votesByUpgrade(_buildId: number): Promise<Record<number, number>> {
  return {};
}
