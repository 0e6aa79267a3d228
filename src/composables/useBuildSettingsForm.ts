// The build settings form as data: the fields in the units people type (dollars, not cents), filled
// from the build, the VIN checked on every keystroke, and the body a save sends.
import { computed, reactive, ref, watch } from 'vue';
import type { CostRecognition } from '@shared/costRecognition';
import { DEFAULT_TIME_ZONE } from '@shared/dates';
import { checkVin } from '@shared/vin';
import type { BuildInput, BuildWithOverride } from '@/api/builds';

/** `isOwner` says whether budget, labour rate and cost recognition are the viewer's to send. */
export function useBuildSettingsForm(isOwner: () => boolean) {
  const form = reactive({
    name: '',
    year: null as number | null,
    make: '',
    model: '',
    trim: '',
    vin: '',
    vinCheckOverridden: false,
    mileage: null as number | null,
    budgetDollars: null as number | null,
    labourRateDollars: null as number | null,
    shopHoursPerWeek: null as number | null,
    shootHoursPerEpisode: null as number | null,
    releaseCadenceDays: null as number | null,
    startDate: '',
    isPublic: false,
    campaign: '',
    summary: '',
    timeZone: DEFAULT_TIME_ZONE,
    costRecognition: 'fitting' as CostRecognition,
    currency: 'USD',
    attributionWindowDays: 30 as number | null,
  });
  /** Every IANA zone this browser knows, for the shop's clock. */
  const zoneOptions = (() => {
    const zones = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
    return [...new Set([DEFAULT_TIME_ZONE, ...zones])].map((z) => ({ label: z.replace(/_/g, ' '), value: z }));
  })();
  const version = ref(0);

  const toDollars = (c: number | null | undefined) => (c === null || c === undefined ? null : c / 100);
  const toCents = (d: number | null) => (d === null ? null : Math.round(d * 100));

  function fill(b: BuildWithOverride) {
    Object.assign(form, {
      name: b.name,
      year: b.year,
      make: b.make,
      model: b.model,
      trim: b.trim ?? '',
      vin: b.vin ?? '',
      vinCheckOverridden: !!b.vinCheckOverridden,
      mileage: b.mileage,
      budgetDollars: toDollars(b.budgetCents),
      labourRateDollars: toDollars(b.labourRateCents),
      shopHoursPerWeek: b.shopHoursPerWeek,
      shootHoursPerEpisode: b.shootHoursPerEpisode,
      releaseCadenceDays: b.releaseCadenceDays,
      startDate: b.startDate ?? '',
      isPublic: b.isPublic,
      campaign: b.campaign ?? '',
      currency: b.currency ?? 'USD',
      attributionWindowDays: b.attributionWindowDays ?? 30,
      summary: b.summary ?? '',
      timeZone: b.timeZone ?? DEFAULT_TIME_ZONE,
      costRecognition: b.costRecognition ?? 'fitting',
    });
    version.value = b.version;
    baseline = body();
  }
  // What the form held when loaded: a save sends only the fields changed since, so re-applying
  // after someone else's save keeps their other changes.
  let baseline: Record<string, unknown> = {};

  // ---- VIN, checked on every keystroke ----
  const vin = computed(() => (form.vin.trim() ? checkVin(form.vin) : null));
  /** A VIN of 17 allowed characters whose check digit does not match may be kept on purpose. */
  const vinOverridable = computed(
    () => !!vin.value && !vin.value.valid && vin.value.normalized.length === 17 && vin.value.checkDigit !== '',
  );
  watch(vinOverridable, (o) => {
    if (!o) form.vinCheckOverridden = false;
  });
  const vinBlocked = computed(
    () => !!vin.value && !vin.value.valid && !(vinOverridable.value && form.vinCheckOverridden),
  );

  function body(): BuildInput & { version: number } {
    const out: BuildInput & { version: number } = {
      name: form.name.trim(),
      year: form.year ?? undefined,
      make: form.make.trim(),
      model: form.model.trim(),
      trim: form.trim.trim(),
      vin: vin.value ? vin.value.normalized : null,
      vinCheckOverridden: vinOverridable.value && form.vinCheckOverridden,
      mileage: form.mileage,
      shopHoursPerWeek: form.shopHoursPerWeek ?? undefined,
      shootHoursPerEpisode: form.shootHoursPerEpisode ?? undefined,
      releaseCadenceDays: form.releaseCadenceDays ?? undefined,
      startDate: form.startDate || undefined,
      isPublic: form.isPublic,
      campaign: form.campaign.trim() || null,
      summary: form.summary.trim() || null,
      timeZone: form.timeZone,
      currency: form.currency.trim().toUpperCase() || undefined,
      attributionWindowDays: form.attributionWindowDays ?? undefined,
      version: version.value,
    };
    // Budget and labour rate are the owner's to set; a producer's save leaves them alone.
    if (isOwner()) {
      out.budgetCents = toCents(form.budgetDollars);
      out.labourRateCents = toCents(form.labourRateDollars);
      out.costRecognition = form.costRecognition;
    }
    return out;
  }

  /** The fields changed since the form was filled, with the version they were based on. */
  function changes(): Record<string, unknown> {
    const full = body() as Record<string, unknown>;
    const out: Record<string, unknown> = { version: version.value };
    for (const [k, v] of Object.entries(full))
      if (k !== 'version' && JSON.stringify(v ?? null) !== JSON.stringify(baseline[k] ?? null)) out[k] = v;
    return out;
  }

  return { form, zoneOptions, version, fill, body, changes, vin, vinOverridable, vinBlocked };
}
