// @vitest-environment happy-dom
// A screen that lays itself out for phones knows it is on a phone from its first render: before,
// the backlog drew the wide table first and swapped to cards once mounted, moving the header's
// buttons under a person's finger (and a test's click) while the page was still settling.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { defineComponent, h, nextTick } from 'vue';
import { mount } from '@vue/test-utils';
import { useMediaQuery } from '../../src/composables/useMediaQuery';

/** A window whose width query matches `now`; `change()` flips it and tells the listeners. */
function fakeMatchMedia(now: boolean) {
  const listeners = new Set<() => void>();
  const mql = {
    get matches() {
      return now;
    },
    addEventListener: (_: string, f: () => void) => listeners.add(f),
    removeEventListener: (_: string, f: () => void) => listeners.delete(f),
  };
  vi.stubGlobal('matchMedia', () => mql);
  return {
    listeners,
    change(to: boolean) {
      now = to;
      for (const f of listeners) f();
    },
  };
}

afterEach(() => vi.unstubAllGlobals());

describe('useMediaQuery', () => {
  it('matches from the first render, before the component is mounted', async () => {
    fakeMatchMedia(true);
    const firstRenders: boolean[] = [];
    const Probe = defineComponent({
      setup() {
        const narrow = useMediaQuery('(max-width: 760px)');
        return () => {
          firstRenders.push(narrow.value);
          return h('p', narrow.value ? 'cards' : 'table');
        };
      },
    });
    const w = mount(Probe);
    await nextTick();
    expect(firstRenders[0]).toBe(true);
    expect(w.text()).toBe('cards');
    w.unmount();
  });

  it('follows the window as it changes and stops listening when the component goes', async () => {
    const win = fakeMatchMedia(false);
    const Probe = defineComponent({
      setup() {
        const narrow = useMediaQuery('(max-width: 760px)');
        return () => h('p', narrow.value ? 'cards' : 'table');
      },
    });
    const w = mount(Probe);
    expect(w.text()).toBe('table');
    win.change(true);
    await nextTick();
    expect(w.text()).toBe('cards');
    w.unmount();
    expect(win.listeners.size).toBe(0);
  });
});
