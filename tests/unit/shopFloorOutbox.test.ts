// @vitest-environment happy-dom
// The waiting-changes bar of the shop floor: the count in words (one change, several changes),
// whether the phone is offline or sending, and a queued photo's upload progress.
import { describe, it, expect } from 'vitest';
import { mount } from '@vue/test-utils';
import ShopFloorOutbox from '../../src/components/ShopFloorOutbox.vue';
import type { QueuedAction } from '../../src/offline/store';

const base = {
  userId: 1,
  buildId: 1,
  upgradeId: 5,
  upgradeTitle: 'Wireless charging pad',
  version: 3,
  createdAt: '2026-12-02T08:00:00.000Z',
};
const start = {
  ...base,
  seq: 1,
  kind: 'mark',
  label: 'Start',
  mark: 'installState',
  change: { installState: 'in_bay' },
} as QueuedAction;
const hours = {
  ...base,
  seq: 2,
  kind: 'hours',
  label: '1.5 h install',
  hours: 1.5,
  labourKind: 'install',
  workedOn: '2026-12-02',
} as QueuedAction;
const photo = {
  ...base,
  seq: 3,
  kind: 'photo',
  label: 'Photo pad.jpg',
  fileName: 'pad.jpg',
  blob: new Blob(['x']),
  stage: 'during',
  episodeId: null,
} as QueuedAction;

describe('ShopFloorOutbox', () => {
  it('says how many changes wait, in words, and that they go when the network is back', () => {
    const w = mount(ShopFloorOutbox, {
      props: { waiting: [start, hours, photo], online: false, sendingSeq: null, progress: {} },
    });
    expect(w.get('[data-test="waiting-count"]').text()).toBe('3 changes waiting to send');
    expect(w.text()).toContain('Offline: they go when the network is back.');
    const one = mount(ShopFloorOutbox, { props: { waiting: [start], online: false, sendingSeq: null, progress: {} } });
    expect(one.get('[data-test="waiting-count"]').text()).toBe('1 change waiting to send');
  });

  it('shows nothing when nothing waits', () => {
    const w = mount(ShopFloorOutbox, { props: { waiting: [], online: true, sendingSeq: null, progress: {} } });
    expect(w.find('[data-test="outbox"]').exists()).toBe(false);
  });

  it("lists the changes on request, with the photo's upload progress while it is being sent", async () => {
    const w = mount(ShopFloorOutbox, {
      props: { waiting: [photo], online: true, sendingSeq: 3, progress: { 3: 0.4 } },
    });
    expect(w.text()).toContain('Sending now…');
    await w.get('button').trigger('click');
    expect(w.get('[data-test="waiting-3"]').text()).toContain('Photo pad.jpg · Wireless charging pad');
    expect((w.get('progress').element as HTMLProgressElement).getAttribute('value')).toBe('40');
    expect(w.get('[data-test="waiting-3"]').text()).toContain('40 %');
  });
});
