import { fireEvent, screen } from '@testing-library/dom';
import { act } from 'react';
import { settle } from './dom';

export async function typeInto(label: string, value: string) {
  await act(async () => {
    fireEvent.change(screen.getByLabelText(label), { target: { value } });
  });
}

export async function press(role: 'button' | 'tab' | 'link', name: string) {
  await act(async () => {
    fireEvent.click(screen.getByRole(role, { name }));
  });
  await settle(6);
}
