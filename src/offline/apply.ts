// The shop floor as the person will see it once their waiting actions arrive: the last answer from
// the server with each waiting mark applied (and the record version it moves to), and waiting hours
// added to the card's and today's totals. Pure: the server's answer is never changed in place.
import type { ShopFloor, ShopFloorItem } from '@/api/shopFloor';
import type { QueuedAction } from './store';

export function withWaiting(data: ShopFloor, waiting: readonly QueuedAction[]): ShopFloor {
  if (!waiting.length) return data;
  // A JSON copy: the answer is plain JSON, and reading a reactive answer this way tracks every field.
  const copy = JSON.parse(JSON.stringify(data)) as ShopFloor;
  const items = [...copy.inBay, ...copy.upgrades];
  const cards = (id: number): ShopFloorItem[] => items.filter((i) => i.upgrade.id === id);
  for (const a of waiting) {
    for (const item of cards(a.upgradeId)) {
      if (a.kind === 'mark') {
        const { installState, installSegment, demoSegment } = a.change;
        if (installState) item.upgrade.installState = installState;
        if (installSegment) item.upgrade.installSegment = installSegment;
        if (demoSegment) item.upgrade.demoSegment = demoSegment;
        item.upgrade.version = a.version + 1;
      } else if (a.kind === 'hours') {
        item.hours.mine += a.hours;
        item.hours.everyone += a.hours;
      }
    }
    if (a.kind === 'hours' && a.workedOn === copy.today.date && cards(a.upgradeId).length) {
      copy.today.mine += a.hours;
      copy.today.everyone += a.hours;
    }
  }
  return copy;
}
