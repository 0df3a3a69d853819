import { screen } from '@testing-library/dom';
import { StatusBadge, type StatusTone } from '@/shared/ui/components';
import { renderDom } from './support/dom';

describe('StatusBadge', () => {
  test('shows its word next to a decorative mark', async () => {
    await renderDom(<StatusBadge tone="pass" label="Within tolerance" testID="badge" />);
    const badge = screen.getByTestId('badge');
    expect(badge.textContent).toBe('Within tolerance');
    const mark = badge.querySelector('svg');
    expect(mark?.getAttribute('aria-hidden')).toBe('true');
  });

  test.each<[StatusTone, string]>([
    ['pass', 'Pass'],
    ['fail', 'Fail'],
    ['warning', 'Warning'],
    ['neutral', 'Note'],
  ])('a blank label on a %s badge falls back to the word "%s", never colour alone', async (tone, word) => {
    await renderDom(<StatusBadge tone={tone} label="  " testID="badge" />);
    expect(screen.getByTestId('badge').textContent).toBe(word);
  });

  test('each tone draws a different mark, so the badge reads without colour', async () => {
    const tones: StatusTone[] = ['pass', 'fail', 'warning', 'neutral'];
    await renderDom(
      <>
        {tones.map((tone) => (
          <StatusBadge key={tone} tone={tone} label={tone} testID={`badge-${tone}`} />
        ))}
      </>,
    );
    const shapes = tones.map((tone) => screen.getByTestId(`badge-${tone}`).querySelector('svg')?.innerHTML);
    expect(new Set(shapes).size).toBe(tones.length);
  });
});
