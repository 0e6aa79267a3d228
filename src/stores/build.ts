// The build being worked on: every screen under /builds/:buildId reads it from here, so the
// vehicle name, capacity and money fields are loaded once and refreshed after a change.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { buildsApi, type BuildWithOverride } from '@/api/builds';
import { ApiError } from '@/api/http';

export const useBuildStore = defineStore('build', () => {
  const build = ref<BuildWithOverride | null>(null);
  const buildId = ref<number | null>(null);
  const loading = ref(false);
  const error = ref('');
  let pending: Promise<void> | null = null;

  async function fetchBuild(id: number) {
    loading.value = true;
    try {
      const r = await buildsApi.get(id);
      if (buildId.value === id) {
        build.value = r.build;
        error.value = '';
      }
    } catch (e) {
      if (buildId.value === id) {
        build.value = null;
        error.value = e instanceof ApiError ? (e.status === 404 ? 'This build does not exist (or was deleted).' : e.message) : 'Could not load the build.';
      }
    } finally {
      loading.value = false;
      pending = null;
    }
  }

  /** Loads the build unless it is already the current one (pass force to re-read it). */
  function load(id: number, force = false): Promise<void> {
    if (!force && buildId.value === id && (build.value || pending)) return pending ?? Promise.resolve();
    if (buildId.value !== id) build.value = null;
    buildId.value = id;
    pending = fetchBuild(id);
    return pending;
  }
  function refresh() {
    return buildId.value ? load(buildId.value, true) : Promise.resolve();
  }
  /** Takes a build the server just answered with (after a save) without another request. */
  function set(b: BuildWithOverride) {
    buildId.value = b.id;
    build.value = b;
    error.value = '';
  }
  function clear() {
    build.value = null;
    buildId.value = null;
    error.value = '';
  }

  const vehicleName = computed(() => (build.value ? vehicleLabel(build.value) : ''));
  return { build, buildId, loading, error, load, refresh, set, clear, vehicleName };
});

/** "2019 Halvorsen Tern Base" from a build's vehicle fields. */
export function vehicleLabel(b: { year: number; make: string; model: string; trim?: string | null }) {
  return [b.year, b.make, b.model, b.trim].filter((x) => x !== null && x !== undefined && String(x).trim() !== '').join(' ');
}
