/**
 * Actions on the rendered app. Each waits for the control it needs (present and enabled), acts,
 * and returns; the test then waits for the outcome it expects (findBy*, waitFor).
 */
import { fireEvent, screen, waitFor } from '@testing-library/dom';
import { act } from 'react';

export async function typeInto(label: string, value: string) {
  const field = await screen.findByLabelText(label);
  await act(async () => {
    fireEvent.change(field, { target: { value } });
  });
}

/** Clicks the control with this role and accessible name once it is there and not disabled. */
export async function press(role: 'button' | 'tab' | 'link' | 'radio' | 'checkbox' | 'switch', name: string) {
  const control = await waitFor(() => {
    const found = screen.getByRole(role, { name });
    if (found.getAttribute('aria-disabled') === 'true') throw new Error(`The ${role} "${name}" is disabled`);
    return found;
  });
  await act(async () => {
    fireEvent.click(control);
  });
}

/** Picks `value` in the native <select> labelled `label`, once that option is offered. */
export async function choose(label: string, value: string) {
  const select = await waitFor(() => {
    const found = screen.getByLabelText(label) as HTMLSelectElement;
    if (!Array.from(found.options).some((option) => option.value === value)) throw new Error(`"${label}" offers no option "${value}" yet`);
    return found;
  });
  await act(async () => {
    fireEvent.change(select, { target: { value } });
  });
  await waitFor(() => expect((screen.getByLabelText(label) as HTMLSelectElement).value).toBe(value));
}
