// @vitest-environment happy-dom
// useZodForm in a mounted component: the shared schema refuses a bad body before anything is
// sent, the server's field errors land on the right field, and other failures in one message.
import { describe, it, expect } from 'vitest';
import { defineComponent, h, reactive } from 'vue';
import { mount, flushPromises } from '@vue/test-utils';
import { useZodForm } from '../../src/composables/useZodForm';
import { ApiError } from '../../src/api/http';
import { createExpenseSchema, type CreateExpenseInput } from '../../shared/schemas/expense';

/** A small expense form, as a screen would write it with the composable. */
function expenseForm(send: (data: CreateExpenseInput) => Promise<{ id: number }>) {
  const sent: CreateExpenseInput[] = [];
  const saved: number[] = [];
  const Form = defineComponent({
    setup() {
      const form = useZodForm(createExpenseSchema);
      const draft = reactive({ description: '', amount: '', spentOn: '2027-02-01' });
      async function save() {
        const body = {
          description: draft.description,
          amountCents: Math.round(Number(draft.amount) * 100),
          spentOn: draft.spentOn,
        };
        const r = await form.submit(body, (data) => {
          sent.push(data);
          return send(data);
        });
        if (r) saved.push(r.id);
      }
      return () =>
        h('form', { onSubmit: (e: Event) => (e.preventDefault(), save()) }, [
          h('label', { for: 'd' }, 'What for'),
          h('input', {
            id: 'd',
            value: draft.description,
            onInput: (e: Event) => (draft.description = (e.target as HTMLInputElement).value),
          }),
          form.errors.value.description
            ? h('p', { 'data-test': 'err-description' }, form.errors.value.description)
            : null,
          h('label', { for: 'a' }, 'Amount (dollars)'),
          h('input', {
            id: 'a',
            value: draft.amount,
            onInput: (e: Event) => (draft.amount = (e.target as HTMLInputElement).value),
          }),
          form.errors.value.amountCents
            ? h('p', { 'data-test': 'err-amountCents' }, form.errors.value.amountCents)
            : null,
          form.failure.value ? h('p', { role: 'alert' }, form.failure.value) : null,
          h('button', { type: 'submit', disabled: form.busy.value }, 'Add expense'),
        ]);
    },
  });
  return { wrapper: mount(Form), sent, saved };
}

/** Types a description and an amount, then submits. */
async function fillAndSubmit(wrapper: ReturnType<typeof mount>, description: string, amount: string) {
  await wrapper.find('#d').setValue(description);
  await wrapper.find('#a').setValue(amount);
  await wrapper.find('form').trigger('submit');
  await flushPromises();
}

describe('useZodForm', () => {
  it('refuses a body the shared schema refuses, names the field, and sends nothing', async () => {
    const { wrapper, sent } = expenseForm(async () => ({ id: 1 }));
    await fillAndSubmit(wrapper, '', '-5');
    expect(sent).toEqual([]);
    expect(wrapper.find('[data-test="err-amountCents"]').text()).toBe('cannot be negative');
    expect(wrapper.find('[data-test="err-description"]').exists()).toBe(true);
  });

  it('sends the parsed body once it is valid, and clears the old errors', async () => {
    const { wrapper, sent, saved } = expenseForm(async () => ({ id: 42 }));
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(wrapper.find('[data-test="err-description"]').exists()).toBe(true);
    await fillAndSubmit(wrapper, '  Trim clips  ', '18.40');
    // The schema trims text; 18.40 dollars are 1840 cents.
    expect(sent).toEqual([{ description: 'Trim clips', amountCents: 1840, spentOn: '2027-02-01' }]);
    expect(saved).toEqual([42]);
    expect(wrapper.find('[data-test="err-description"]').exists()).toBe(false);
  });

  it("shows the server's field errors on the right field", async () => {
    const { wrapper, saved } = expenseForm(async () => {
      throw new ApiError(400, 'bad_request', 'Check these fields: amountCents.', [
        { path: 'amountCents', message: 'is more than the budget allows' },
      ]);
    });
    await fillAndSubmit(wrapper, 'Wheels', '9000');
    expect(saved).toEqual([]);
    expect(wrapper.find('[data-test="err-amountCents"]').text()).toBe('is more than the budget allows');
    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
  });

  it('shows an error without fields, or a lost connection, as one message', async () => {
    const refused = expenseForm(async () => {
      throw new ApiError(409, 'stale', 'Someone else changed this first.');
    });
    await fillAndSubmit(refused.wrapper, 'Wheels', '10');
    expect(refused.wrapper.find('[role="alert"]').text()).toBe('Someone else changed this first.');

    const offline = expenseForm(async () => {
      throw new TypeError('Failed to fetch');
    });
    await fillAndSubmit(offline.wrapper, 'Wheels', '10');
    expect(offline.wrapper.find('[role="alert"]').text()).toBe('That did not go through. Try again in a moment.');
    expect(offline.wrapper.find('button').attributes('disabled')).toBeUndefined();
  });
});
