// Which build is open (client state only): every screen under /builds/:buildId works on it. The
// build's record is server data and lives in the query cache (src/queries/build.ts).
import { defineStore } from 'pinia';
import { ref } from 'vue';

export const useBuildStore = defineStore('build', () => {
  const buildId = ref<number | null>(null);
  function open(id: number) {
    buildId.value = id;
  }
  function clear() {
    buildId.value = null;
  }
  return { buildId, open, clear };
});

/** "2019 Halvorsen Tern Base" from a build's vehicle fields. */
export function vehicleLabel(b: { year: number; make: string; model: string; trim?: string | null }) {
  return [b.year, b.make, b.model, b.trim]
    .filter((x) => x !== null && x !== undefined && String(x).trim() !== '')
    .join(' ');
}
