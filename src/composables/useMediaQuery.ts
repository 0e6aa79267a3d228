// Whether a media query matches: right from the first render (a phone never draws the wide layout
// first and then swaps it, moving what a person was about to tap), and as the window changes.
import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue';

export function useMediaQuery(query: string): Ref<boolean> {
  const mq = typeof window !== 'undefined' && typeof window.matchMedia === 'function' ? window.matchMedia(query) : null;
  const matches = ref(!!mq?.matches);
  const onChange = () => (matches.value = !!mq?.matches);
  onMounted(() => {
    onChange();
    mq?.addEventListener('change', onChange);
  });
  onBeforeUnmount(() => mq?.removeEventListener('change', onChange));
  return matches;
}
