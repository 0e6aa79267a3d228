// @vitest-environment happy-dom
// The query side of the client's data layer in a mounted component: loading and error states from
// useApiQuery, errors worded in one place (errorMessage), and invalidation by the key factory —
// a write or a live notice on one build re-fetches that build's queries and no other build's.
import { describe, it, expect } from 'vitest';
import { defineComponent, h } from 'vue';
import { mount, flushPromises } from '@vue/test-utils';
import { VueQueryPlugin } from '@tanstack/vue-query';
import { useApiQuery } from '../../src/composables/useApiQuery';
import { errorMessage, fieldErrorsOf, fieldOrMessage } from '../../src/composables/errorMessage';
import { createQueryClient } from '../../src/queries/client';
import { invalidateBuild, keys } from '../../src/queries/keys';
import { ApiError } from '../../src/api/http';

/** Mounts one component that reads `key` with `fetch`, and shows its state as text. */
function screen(key: () => readonly unknown[] | null, fetch: () => Promise<string>, client = createQueryClient()) {
  const Screen = defineComponent({
    setup() {
      const q = useApiQuery(key, fetch, {
        fallback: 'Could not load the episodes.',
        byStatus: { 404: 'This build does not exist.' },
      });
      return () =>
        h('div', [
          q.loading.value ? h('p', { 'data-test': 'loading' }, 'Loading') : null,
          q.error.value ? h('p', { role: 'alert' }, q.error.value) : null,
          q.data.value ? h('p', { 'data-test': 'data' }, q.data.value) : null,
        ]);
    },
  });
  return { wrapper: mount(Screen, { global: { plugins: [[VueQueryPlugin, { queryClient: client }]] } }), client };
}

describe('errorMessage', () => {
  it("uses the server's words, a status's words, or the screen's fallback", () => {
    expect(errorMessage(new ApiError(409, 'stale', 'Someone saved first.'), 'Could not save.')).toBe(
      'Someone saved first.',
    );
    expect(
      errorMessage(new ApiError(404, 'not_found', 'Not found.'), 'Could not load.', {
        404: 'This build does not exist.',
      }),
    ).toBe('This build does not exist.');
    expect(errorMessage(new TypeError('fetch failed'), 'Could not load.')).toBe('Could not load.');
    expect(errorMessage('odd', 'Could not load.')).toBe('Could not load.');
  });
  it('gives the field errors by path, and one field before the message', () => {
    const e = new ApiError(400, 'bad_request', 'Check these fields.', [
      { path: 'hours', message: 'must be more than 0' },
      { path: 'hours', message: 'a day has 24 hours' },
      { path: 'note', message: 'at most 500 characters' },
    ]);
    expect(fieldErrorsOf(e)).toEqual({ hours: 'must be more than 0', note: 'at most 500 characters' });
    expect(fieldErrorsOf(new Error('x'))).toEqual({});
    expect(fieldOrMessage(e, 'note', 'Could not save.')).toBe('at most 500 characters');
    expect(fieldOrMessage(e, 'kind', 'Could not save.')).toBe('Check these fields.');
    expect(fieldOrMessage(null, 'kind', 'Could not save.')).toBe('Could not save.');
  });
});

describe('useApiQuery', () => {
  it('shows loading, then the data', async () => {
    let resolve!: (v: string) => void;
    const { wrapper } = screen(
      () => keys.episodes(1),
      () => new Promise<string>((r) => (resolve = r)),
    );
    await flushPromises();
    expect(wrapper.find('[data-test="loading"]').exists()).toBe(true);
    resolve('Episode 4');
    await flushPromises();
    expect(wrapper.find('[data-test="loading"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="data"]').text()).toBe('Episode 4');
    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
  });

  it("words a failure once: the server's message, a status's words, or the fallback", async () => {
    const server = screen(
      () => keys.episodes(1),
      () => Promise.reject(new ApiError(403, 'forbidden', 'Your role cannot see this.')),
    );
    const missing = screen(
      () => keys.episodes(2),
      () => Promise.reject(new ApiError(404, 'not_found', 'Not found.')),
    );
    const offline = screen(
      () => keys.episodes(3),
      () => Promise.reject(new TypeError('Failed to fetch')),
    );
    await flushPromises();
    expect(server.wrapper.find('[role="alert"]').text()).toBe('Your role cannot see this.');
    expect(missing.wrapper.find('[role="alert"]').text()).toBe('This build does not exist.');
    expect(offline.wrapper.find('[role="alert"]').text()).toBe('Could not load the episodes.');
  });

  it('asks for nothing while the key is null', async () => {
    let calls = 0;
    const { wrapper } = screen(
      () => null,
      async () => String(++calls),
    );
    await flushPromises();
    expect(calls).toBe(0);
    expect(wrapper.find('[data-test="data"]').exists()).toBe(false);
  });
});

describe('key factory invalidation', () => {
  it("re-fetches every query of the build written to, and none of another build's", async () => {
    const client = createQueryClient();
    const calls: Record<string, number> = {};
    const count = (name: string) => async () => String((calls[name] = (calls[name] ?? 0) + 1));
    screen(() => keys.episodes(7), count('episodes 7'), client);
    screen(() => keys.upgrades(7, { page: 2 }), count('upgrades 7 page 2'), client);
    screen(() => keys.buildRecord(7), count('record 7'), client);
    screen(() => keys.episodes(8), count('episodes 8'), client);
    await flushPromises();
    expect(calls).toEqual({ 'episodes 7': 1, 'upgrades 7 page 2': 1, 'record 7': 1, 'episodes 8': 1 });

    await invalidateBuild(client, 7);
    await flushPromises();
    expect(calls).toEqual({ 'episodes 7': 2, 'upgrades 7 page 2': 2, 'record 7': 2, 'episodes 8': 1 });

    // Narrowed to one resource: only the upgrades of build 7 (every page and filter of it).
    await invalidateBuild(client, 7, 'upgrades');
    await flushPromises();
    expect(calls).toEqual({ 'episodes 7': 2, 'upgrades 7 page 2': 3, 'record 7': 2, 'episodes 8': 1 });
  });

  it('keeps the keys of one build under one prefix', () => {
    const prefix = keys.build(3);
    for (const k of [
      keys.buildRecord(3),
      keys.upgrades(3),
      keys.upgrades(3, { q: 'x' }),
      keys.everyUpgrade(3),
      keys.upgrade(3, 9),
      keys.episodes(3),
      keys.parts(3),
      keys.viewerRequests(3, 'new'),
      keys.media(3),
    ])
      expect(k.slice(0, 2)).toEqual([...prefix]);
    expect(keys.upgrades(3, { page: 1 }).slice(0, 3)).toEqual([...keys.upgrades(3)]);
  });
});
