// Light or dark, remembered on this device; follows the system until the person picks.
import { ref, watch } from 'vue';

const stored = typeof localStorage !== 'undefined' ? localStorage.getItem('bayslate.mode') : null;
const prefersDark = typeof matchMedia !== 'undefined' && matchMedia('(prefers-color-scheme: dark)').matches;
const dark = ref(stored ? stored === 'dark' : prefersDark);
watch(dark, (v) => localStorage.setItem('bayslate.mode', v ? 'dark' : 'light'));

export function useColorMode() {
  return { dark, toggle: () => (dark.value = !dark.value) };
}
