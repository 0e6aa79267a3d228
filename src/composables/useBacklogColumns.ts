// The backlog table's columns: sortable headers that follow the remote sort, each upgrade's title as
// the button that opens its drawer, and the value added only for those who see money.
import { computed, h, type Ref } from 'vue';
import type { DataTableColumns } from 'naive-ui';
import StateTag from '@/components/StateTag.vue';
import AppIcon from '@/components/AppIcon.vue';
import type { UpgradeSort } from '@/api/upgrades';
import {
  AREA_LABELS,
  INSTALL_STATE_LABELS,
  isUpgradeDone,
  type EpisodeRecord,
  type UpgradeRecord,
} from '@shared/domain';
import { SAFETY_CAUTIONS } from '@shared/safety';
import { formatCents, formatHours } from '@/theme';

/** An upgrade's episode as the backlog words it: its number, or a dash when it is in none. */
export function episodeLabel(episodes: EpisodeRecord[], id: number | null) {
  if (id === null) return '—';
  const e = episodes.find((x) => x.id === id);
  return e ? `Ep. ${e.number}` : 'In an episode';
}

export function useBacklogColumns({
  sort,
  episodes,
  seesMoney,
  open,
}: {
  sort: Ref<{ key: UpgradeSort; dir: 'asc' | 'desc' } | null>;
  episodes: Ref<EpisodeRecord[]>;
  seesMoney: () => boolean;
  open: (id: number) => void;
}) {
  const segmentsText = (u: UpgradeRecord) =>
    `Install ${u.installSegment === 'shot' ? 'shot' : 'not shot'}, demo ${u.demoSegment === 'shot' ? 'shot' : 'not shot'}`;
  const sortOrder = (key: UpgradeSort) =>
    sort.value?.key === key ? (sort.value.dir === 'asc' ? 'ascend' : 'descend') : false;

  const columns = computed<DataTableColumns<UpgradeRecord>>(() => {
    const cols: DataTableColumns<UpgradeRecord> = [
      {
        title: 'Upgrade',
        key: 'title',
        sorter: true,
        sortOrder: sortOrder('title'),
        minWidth: 220,
        render: (u) =>
          h('button', { type: 'button', class: 'link-btn', 'data-test': `open-${u.id}`, onClick: () => open(u.id) }, [
            u.title,
            isUpgradeDone(u) ? h('span', { class: 'done-mark' }, ' · done') : null,
          ]),
      },
      {
        title: 'Area',
        key: 'area',
        sorter: true,
        sortOrder: sortOrder('area'),
        width: 140,
        render: (u) => AREA_LABELS[u.area],
      },
      {
        title: 'Install state',
        key: 'installState',
        sorter: true,
        sortOrder: sortOrder('installState'),
        width: 140,
        render: (u) => h(StateTag, { state: u.installState, label: INSTALL_STATE_LABELS[u.installState] }),
      },
      { title: 'Filming', key: 'filming', width: 200, render: segmentsText },
      {
        title: 'Episode',
        key: 'episode',
        sorter: true,
        sortOrder: sortOrder('episode'),
        width: 110,
        render: (u) => episodeLabel(episodes.value, u.episodeId),
      },
      {
        title: 'Est. hours',
        key: 'estimatedHours',
        sorter: true,
        sortOrder: sortOrder('estimatedHours'),
        width: 110,
        align: 'right',
        render: (u) => formatHours(u.estimatedHours),
      },
      { title: 'Priority', key: 'priority', sorter: true, sortOrder: sortOrder('priority'), width: 95, align: 'right' },
      {
        title: 'Safety',
        key: 'safety',
        minWidth: 170,
        render: (u) =>
          u.safetyFlags.length
            ? h('span', { class: 'flags' }, [
                h(AppIcon, { name: 'caution', size: 16, label: 'Caution' }),
                ' ',
                u.safetyFlags.map((f) => SAFETY_CAUTIONS[f].label).join(', '),
              ])
            : '—',
      },
    ];
    if (seesMoney())
      cols.push({
        title: 'Value added',
        key: 'valueAddedCents',
        width: 120,
        align: 'right',
        render: (u) => formatCents(u.valueAddedCents),
      });
    return cols;
  });
  return columns;
}
