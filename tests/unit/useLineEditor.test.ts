// @vitest-environment happy-dom
// useLineEditor, the one editor behind the drawer's line lists (labour, expenses, parts, removed
// parts), mounted the way a line list uses it: the shared schema refuses a bad line before
// anything is sent, the server's field errors land on their fields, a save says so and closes the
// form, and a delete asks first and only then sends.
import { describe, it, expect, afterEach } from 'vitest';
import { defineComponent, h, reactive } from 'vue';
import { mount, flushPromises } from '@vue/test-utils';
import { NDialogProvider, NMessageProvider } from 'naive-ui';
import { useLineEditor } from '../../src/composables/useLineEditor';
import { ApiError } from '../../src/api/http';
import { createLabourSchema } from '../../shared/schemas/labour';

type Body = { upgradeId: number; workedOn: string; hours: number; kind: 'install' };

/** A labour list as the drawer writes it, with the sends and the "changed" notices recorded. */
function labourList(send: (b: Body) => Promise<unknown>, remove: () => Promise<unknown> = async () => undefined) {
  const sent: Body[] = [];
  let changed = 0;
  let removed = 0;
  const List = defineComponent({
    setup() {
      const editor = useLineEditor(createLabourSchema, () => changed++);
      const form = reactive({ hours: 1 });
      async function log() {
        const body: Body = { upgradeId: 5, workedOn: '2027-03-02', hours: form.hours, kind: 'install' };
        await editor.save(body, (b) => (sent.push(b), send(b)), {
          done: `${b(body)} logged.`,
          failed: 'Could not log the hours.',
        });
      }
      const b = (x: Body) => `${x.hours} h`;
      return () =>
        h('div', [
          h('button', { 'data-test': 'open', onClick: () => (editor.open.value = true) }, 'Log hours'),
          editor.open.value
            ? h('form', { onSubmit: (e: Event) => (e.preventDefault(), log()) }, [
                h('input', {
                  id: 'hours',
                  value: form.hours,
                  onInput: (e: Event) => (form.hours = Number((e.target as HTMLInputElement).value)),
                }),
                editor.fb('hours').feedback ? h('p', { 'data-test': 'err-hours' }, editor.fb('hours').feedback) : null,
                h('button', { type: 'submit' }, 'Save hours'),
              ])
            : null,
          h(
            'button',
            {
              'data-test': 'delete',
              onClick: () =>
                editor.confirmRemove({
                  title: 'Delete this time entry?',
                  content: '2 h on 2027-03-02.',
                  positiveText: 'Delete the entry',
                  send: () => (removed++, remove()),
                  done: 'Entry deleted.',
                  failed: 'Could not delete the entry.',
                }),
            },
            'Delete',
          ),
        ]);
    },
  });
  const Root = defineComponent({
    setup: () => () => h(NMessageProvider, null, () => h(NDialogProvider, null, () => h(List))),
  });
  const wrapper = mount(Root, { attachTo: document.body });
  return { wrapper, sent, changed: () => changed, removed: () => removed };
}

async function logHours(wrapper: ReturnType<typeof mount>, hours: string) {
  await wrapper.find('[data-test="open"]').trigger('click');
  await wrapper.find('#hours').setValue(hours);
  await wrapper.find('form').trigger('submit');
  await flushPromises();
}
const page = () => document.body.textContent ?? '';

afterEach(() => {
  document.body.innerHTML = '';
});

describe('useLineEditor', () => {
  it('refuses a line the shared schema refuses, on its field, and sends nothing', async () => {
    const { wrapper, sent, changed } = labourList(async () => ({}));
    await logHours(wrapper, '0');
    expect(sent).toEqual([]);
    expect(wrapper.find('[data-test="err-hours"]').text()).toBe('must be more than 0');
    expect(changed()).toBe(0);
    await flushPromises();
    expect(page()).toContain('Some fields need attention.');
    wrapper.unmount();
  });

  it('sends a good line, says so, closes the form and tells the drawer', async () => {
    const { wrapper, sent, changed } = labourList(async () => ({ labourEntry: { id: 1 } }));
    await logHours(wrapper, '2.5');
    expect(sent).toEqual([{ upgradeId: 5, workedOn: '2027-03-02', hours: 2.5, kind: 'install' }]);
    expect(changed()).toBe(1);
    expect(wrapper.find('form').exists()).toBe(false);
    expect(page()).toContain('2.5 h logged.');
    wrapper.unmount();
  });

  it("puts the server's field errors on their field and keeps the form open", async () => {
    const { wrapper, changed } = labourList(async () => {
      throw new ApiError(400, 'bad_request', 'Check these fields: hours.', [
        { path: 'hours', message: 'is more than this person logged today allows' },
      ]);
    });
    await logHours(wrapper, '3');
    expect(wrapper.find('[data-test="err-hours"]').text()).toBe('is more than this person logged today allows');
    expect(wrapper.find('form').exists()).toBe(true);
    expect(changed()).toBe(0);
    expect(page()).toContain('Some fields need attention.');
    wrapper.unmount();
  });

  it("words a failure through errorMessage: the server's words, or the editor's own", async () => {
    const refused = labourList(async () => {
      throw new ApiError(403, 'forbidden', 'Only the person who logged it may change it.');
    });
    await logHours(refused.wrapper, '3');
    expect(page()).toContain('Only the person who logged it may change it.');
    refused.wrapper.unmount();
    document.body.innerHTML = '';
    const offline = labourList(async () => {
      throw new TypeError('Failed to fetch');
    });
    await logHours(offline.wrapper, '3');
    expect(page()).toContain('Could not log the hours.');
    offline.wrapper.unmount();
  });

  it('asks before deleting, and deletes only when the person agrees', async () => {
    const { wrapper, removed, changed } = labourList(async () => ({}));
    await wrapper.find('[data-test="delete"]').trigger('click');
    await flushPromises();
    expect(page()).toContain('Delete this time entry?');
    expect(removed()).toBe(0);
    const agree = [...document.querySelectorAll('button')].find((b) => b.textContent?.includes('Delete the entry'));
    expect(agree).toBeTruthy();
    agree!.click();
    await flushPromises();
    expect(removed()).toBe(1);
    expect(changed()).toBe(1);
    expect(page()).toContain('Entry deleted.');
    wrapper.unmount();
  });
});
