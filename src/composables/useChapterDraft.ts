// The publish screen's chapter marks as typed: rows of time, title and upgrade, the video runtime, and
// the live checks (the same shared rules the server applies) before anything is saved.
import { computed, ref } from 'vue';
import { formatChapterTime, parseChapterTime, validateChapters } from '@shared/showNotes';

export interface ChapterRow {
  key: number;
  time: string;
  title: string;
  upgradeId: number | null;
}

export function useChapterDraft() {
  const rows = ref<ChapterRow[]>([]);
  const runtime = ref('');
  let nextKey = 1;

  function fill(chapters: { startSeconds: number; title: string; upgradeId: number | null }[], seconds: number | null) {
    rows.value = chapters.map((c) => ({
      key: nextKey++,
      time: formatChapterTime(c.startSeconds),
      title: c.title,
      upgradeId: c.upgradeId,
    }));
    runtime.value = seconds ? formatChapterTime(seconds) : '';
  }
  function addRow() {
    const last = rows.value.at(-1);
    const at = last ? (parseChapterTime(last.time) ?? 0) + 60 : 0;
    rows.value.push({ key: nextKey++, time: formatChapterTime(at), title: '', upgradeId: null });
  }
  function removeRow(key: number) {
    rows.value = rows.value.filter((r) => r.key !== key);
  }

  const runtimeSeconds = computed(() => (runtime.value.trim() ? parseChapterTime(runtime.value) : null));
  const runtimeProblem = computed(() =>
    runtime.value.trim() && runtimeSeconds.value === null ? 'Write the runtime as m:ss or h:mm:ss.' : '',
  );
  const chapters = computed(() =>
    rows.value.map((r) => ({
      startSeconds: parseChapterTime(r.time) ?? Number.NaN,
      title: r.title,
      upgradeId: r.upgradeId,
    })),
  );
  const problems = computed(() => {
    const out: Record<number, string[]> = {};
    rows.value.forEach((r, i) => {
      if (parseChapterTime(r.time) === null)
        (out[i] ??= []).push('Write the time as m:ss or h:mm:ss (e.g. 4:05 or 1:02:30).');
    });
    for (const p of validateChapters(
      chapters.value.map((c) => ({ ...c, startSeconds: Number.isNaN(c.startSeconds) ? -1 : c.startSeconds })),
      runtimeSeconds.value,
    )) {
      if (p.field === 'startSeconds' && parseChapterTime(rows.value[p.index]!.time) === null) continue;
      (out[p.index] ??= []).push(p.message);
    }
    return out;
  });
  const hasProblems = computed(() => Object.keys(problems.value).length > 0 || !!runtimeProblem.value);

  return { rows, runtime, fill, addRow, removeRow, runtimeSeconds, runtimeProblem, chapters, problems, hasProblems };
}
