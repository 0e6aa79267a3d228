// @vitest-environment happy-dom
// Live notices of one build, read with the shared BuildChange contract: a notice that matches it
// passes on what changed and invalidates that build's queries; one that does not (bad JSON, a
// missing or malformed `what`) means "fetch everything" ('*'), never a half-read list.
import { describe, it, expect, vi, afterEach } from 'vitest';
import { defineComponent, h } from 'vue';
import { mount } from '@vue/test-utils';
import { VueQueryPlugin } from '@tanstack/vue-query';
import { useBuildEvents } from '../../src/composables/useBuildEvents';
import { createQueryClient } from '../../src/queries/client';
import { keys } from '../../src/queries/keys';

/** A stand-in for the browser's EventSource: the test sends the server's messages itself. */
class FakeSource extends EventTarget {
  static last: FakeSource | null = null;
  constructor(public url: string) {
    super();
    FakeSource.last = this;
  }
  close() {}
  send(data: string) {
    this.dispatchEvent(new MessageEvent('change', { data }));
  }
}

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

function listen() {
  vi.useFakeTimers();
  vi.stubGlobal('EventSource', FakeSource);
  const heard: string[][] = [];
  const client = createQueryClient();
  client.setQueryData(keys.episodes(7), { episodes: [] });
  client.setQueryData(keys.episodes(8), { episodes: [] });
  const Screen = defineComponent({
    setup() {
      useBuildEvents(
        () => 7,
        (what) => heard.push(what),
      );
      return () => h('div');
    },
  });
  mount(Screen, { global: { plugins: [[VueQueryPlugin, { queryClient: client }]] } });
  return { heard, client, source: FakeSource.last! };
}

describe('useBuildEvents', () => {
  it('passes on what changed and marks only that build stale', () => {
    const { heard, client, source } = listen();
    expect(source.url).toBe('/api/builds/7/events');
    source.send(JSON.stringify({ what: ['parts', 'upgrades'] }));
    vi.advanceTimersByTime(250);
    expect(heard).toEqual([['parts', 'upgrades']]);
    expect(client.getQueryState(keys.episodes(7))?.isInvalidated).toBe(true);
    expect(client.getQueryState(keys.episodes(8))?.isInvalidated).toBe(false);
  });
  it('reads a notice that does not match the contract as "fetch everything"', () => {
    const { heard, source } = listen();
    for (const bad of ['not json', '{}', '{"what":"parts"}', '{"what":[1,2]}']) {
      source.send(bad);
      vi.advanceTimersByTime(250);
    }
    expect(heard).toEqual([['*'], ['*'], ['*'], ['*']]);
  });
});
