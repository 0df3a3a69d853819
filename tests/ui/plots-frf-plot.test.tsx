/**
 * The FRF and line plots rendered into the DOM: curves, bands and tolerance drawn, the axis and
 * scale choices, the crosshair read-out from pointer and keyboard, zoom by band buttons and drag.
 * The read-out values are checked against the analytic SDOF receptance 1/(k − mω² + jcω)
 * (standard vibration textbook result, e.g. S. S. Rao, Mechanical Vibrations).
 */
import { fireEvent, screen, waitFor, within } from '@testing-library/dom';
import { act } from 'react';
import { exportFileName, FrfPlot, LinePlot, panelSvg } from '@/shared/ui/plots';
import { curveColors } from '@/shared/ui/theme';
import { renderDom } from './support/dom';

// jsdom has no PointerEvent; a MouseEvent with pointerType stands in, so clientX reaches the plot.
class TestPointerEvent extends MouseEvent {
  pointerType: string;
  pointerId: number;
  constructor(type: string, init: MouseEventInit & { pointerType?: string; pointerId?: number } = {}) {
    super(type, init);
    this.pointerType = init.pointerType ?? 'mouse';
    this.pointerId = init.pointerId ?? 1;
  }
}
(window as unknown as { PointerEvent: unknown }).PointerEvent = TestPointerEvent;

const m = 1;
const k = 1e4 * (2 * Math.PI) ** 2; // fn = 100 Hz
const zeta = 0.01;
const c = 2 * zeta * Math.sqrt(k * m);
const f = Float64Array.from({ length: 2000 }, (_, i) => 1 + i * 0.5); // 1…1000.5 Hz
const exact = { re: new Float64Array(f.length), im: new Float64Array(f.length) };
f.forEach((v, i) => {
  const w = 2 * Math.PI * v;
  const a = k - m * w * w;
  const b = c * w;
  exact.re[i] = a / (a * a + b * b);
  exact.im[i] = -b / (a * a + b * b);
});
const h1 = { re: exact.re.map((v) => v * 0.9), im: exact.im.map((v) => v * 0.9) };
const low = Float64Array.from(f, (_, i) => 0.8 * Math.hypot(h1.re[i], h1.im[i]));
const high = Float64Array.from(f, (_, i) => 1.2 * Math.hypot(h1.re[i], h1.im[i]));

async function renderFrf() {
  const result = await renderDom(
    <FrfPlot
      title="Test FRF"
      unit="m/N"
      curves={[
        { id: 'exact', label: 'Exact', color: curveColors.exact, dashed: true, frequenciesHz: f, frf: exact },
        { id: 'h1', label: 'H1', color: curveColors.h1, frequenciesHz: f, frf: h1, confidence: { magnitudeLow: low, magnitudeHigh: high } },
      ]}
      tolerance={{ curveId: 'exact', db: 1 }}
      zoomBands={[{ label: 'Mode 1', low: 90, high: 110 }]}
      testID="frf"
    />,
  );
  // The frames draw once the panel knows its width.
  await waitFor(() => expect(screen.getByTestId('frf-magnitude').querySelectorAll('path').length).toBeGreaterThan(0));
  return result;
}

describe('FrfPlot', () => {
  test('draws the curves, the 15 % band and brass tolerance lines, and lists them in the legend', async () => {
    const { container } = await renderFrf();
    const magnitude = screen.getByTestId('frf-magnitude');
    const paths = Array.from(magnitude.querySelectorAll('path'));
    const dashed = paths.filter((p) => p.getAttribute('stroke-dasharray') === '6 4');
    expect(dashed).toHaveLength(1); // the exact FRF
    expect(paths.some((p) => p.getAttribute('fill-opacity') === '0.15')).toBe(true);
    expect(paths.filter((p) => p.getAttribute('stroke') === curveColors.tolerance)).toHaveLength(2);
    // Decimated: 2000 lines on a 320 px frame draw fewer than 4 points per column.
    const d = paths.find((p) => p.getAttribute('stroke') === curveColors.h1)!.getAttribute('d')!;
    expect((d.match(/L/g) ?? []).length).toBeLessThan(4 * 320);
    const legend = within(screen.getByRole('list', { name: 'Legend' }));
    expect(legend.getByText('Exact')).toBeTruthy();
    expect(legend.getByText('H1 95 % band')).toBeTruthy();
    expect(legend.getByText('Tolerance ±1 dB')).toBeTruthy();
    expect(container.querySelector('[data-plot-caption="Magnitude · dB re 1 m/N"]')).not.toBeNull();
  });

  test('the pointer places the plumb-line crosshair and the read-out gives values with units', async () => {
    await renderFrf();
    const magnitude = screen.getByTestId('frf-magnitude');
    // jsdom lays nothing out: the frame's left edge is at 0, so clientX is the x pixel.
    await act(async () => {
      fireEvent.pointerMove(magnitude, { clientX: 200, pointerType: 'mouse' });
    });
    const readout = screen.getByTestId('frf-readout');
    // 200 px on a log axis from 1 to 1000.5 Hz drawn over 56…308 px: 10^(3.0002·144/252) Hz.
    const expectedHz = Math.pow(1000.5, (200 - 56) / (308 - 56));
    const line = f[Math.round((expectedHz - 1) / 0.5)];
    expect(readout.textContent).toContain(`${line.toPrecision(4)} Hz`);
    expect(readout.textContent).toMatch(/H1.*dB/);
    // Home puts the crosshair at the lowest line, 1 Hz, where |H| ≈ 1/k and the phase ≈ 0°.
    await act(async () => {
      fireEvent.keyDown(magnitude, { key: 'Home' });
    });
    expect(readout.textContent).toContain('1.000 Hz');
    const w = 2 * Math.PI;
    const dbAt1Hz = -20 * Math.log10(Math.hypot(k - m * w * w, c * w));
    const phaseAt1Hz = (-Math.atan2(c * w, k - m * w * w) * 180) / Math.PI;
    expect(readout.textContent).toContain(`Exact${dbAt1Hz.toPrecision(4).replace('-', '−')} dB  ${phaseAt1Hz.toPrecision(4).replace('-', '−')}°`);
  });

  test('switching to linear magnitude and unwrapped phase relabels the axes', async () => {
    const { container } = await renderFrf();
    await act(async () => {
      fireEvent.click(screen.getByRole('radio', { name: 'Magnitude: Linear' }));
      fireEvent.click(screen.getByRole('radio', { name: 'Phase: Unwrapped' }));
    });
    expect(screen.getByRole('radio', { name: 'Magnitude: Linear' }).getAttribute('aria-checked')).toBe('true');
    expect(container.querySelector('[data-plot-caption="Magnitude · m/N"]')).not.toBeNull();
    expect(screen.getByTestId('frf-magnitude').getAttribute('aria-label')).toContain('magnitude in m/N');
  });

  test('a band button zooms, a drag zooms further, Reset zoom returns to the whole range', async () => {
    await renderFrf();
    const reset = screen.getByRole('button', { name: 'Reset zoom' });
    expect(reset.getAttribute('aria-disabled')).toBe('true');
    const ticksBefore = tickLabels();
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Mode 1' }));
    });
    expect(reset.getAttribute('aria-disabled')).not.toBe('true');
    const zoomedTicks = tickLabels();
    expect(zoomedTicks).not.toEqual(ticksBefore);
    expect(zoomedTicks).toContain('100');

    const phase = screen.getByTestId('frf-phase');
    await act(async () => {
      fireEvent.pointerDown(phase, { clientX: 80, pointerType: 'touch' });
      fireEvent.pointerMove(phase, { clientX: 140, pointerType: 'touch' });
    });
    expect(phase.querySelectorAll('rect[fill-opacity="0.15"]')).toHaveLength(1); // the selection
    await act(async () => {
      fireEvent.pointerUp(phase, { clientX: 140, pointerType: 'touch' });
    });
    expect(phase.querySelectorAll('rect[fill-opacity="0.15"]')).toHaveLength(0);
    expect(tickLabels()).not.toEqual(zoomedTicks);

    await act(async () => {
      fireEvent.click(reset);
    });
    expect(tickLabels()).toEqual(ticksBefore);
  });
});

describe('export', () => {
  test('the panel becomes one standalone SVG with title, captions, both frames and the legend', async () => {
    await renderFrf();
    const panel = screen.getByTestId('frf');
    const { svg, width, height } = panelSvg(panel, 'Test FRF');
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).toContain('>Test FRF</text>');
    expect(svg).toContain('>Magnitude · dB re 1 m/N</text>');
    expect(svg).toContain('>Phase · degrees</text>');
    expect(svg).toContain('>H1 95 % band</text>');
    expect(svg).toContain('stroke-dasharray="6 4"'); // the exact FRF, copied from the frame
    expect((svg.match(/<g transform="translate/g) ?? []).length).toBe(2); // magnitude and phase
    expect(width).toBeGreaterThanOrEqual(320);
    expect(height).toBeGreaterThan(220 + 150);
    // The document parses as XML.
    const parsed = new DOMParser().parseFromString(svg, 'image/svg+xml');
    expect(parsed.getElementsByTagName('parsererror')).toHaveLength(0);
    expect(exportFileName('Exact FRF, seed 1', 'png')).toBe('exact-frf-seed-1.png');
  });
});

function tickLabels(): string[] {
  const frame = screen.getByTestId('frf-magnitude');
  return Array.from(frame.querySelectorAll('text[text-anchor="middle"]')).map((t) => t.textContent ?? '');
}

describe('LinePlot', () => {
  test('coherence with a floor: fixed 0…1 axis, the rule in the legend, values in the read-out', async () => {
    const x = [10, 20, 30, 40];
    await renderDom(
      <LinePlot
        title="Coherence"
        x={{ kind: 'linear', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Coherence', unit: '', domain: [0, 1] }}
        series={[{ id: 'g', label: 'γ²', color: curveColors.coherence, x, y: [0.99, 0.5, 0.9, 1] }]}
        rules={[{ id: 'floor', label: 'Minimum coherence 0.8', value: 0.8, color: curveColors.tolerance }]}
        testID="coh"
      />,
    );
    const frame = await screen.findByTestId('coh-frame');
    await waitFor(() => expect(frame.querySelectorAll('text[text-anchor="end"]').length).toBeGreaterThan(0));
    const labels = Array.from(frame.querySelectorAll('text[text-anchor="end"]')).map((t) => t.textContent);
    expect(labels).toEqual(['0', '0.2', '0.4', '0.6', '0.8', '1']);
    expect(screen.getByText('Minimum coherence 0.8')).toBeTruthy();
    await act(async () => {
      fireEvent.keyDown(frame, { key: 'End' });
    });
    expect(screen.getByTestId('coh-readout').textContent).toContain('40.00 Hz');
    expect(screen.getByTestId('coh-readout').textContent).toContain('1.000');
  });

  test('predicted against observed draws points and the line y = x', async () => {
    await renderDom(
      <LinePlot
        title="Random error"
        x={{ kind: 'linear', label: 'Predicted', unit: '%' }}
        y={{ kind: 'linear', label: 'Observed', unit: '%' }}
        series={[{ id: 'p', label: 'Lines', color: curveColors.h1, style: 'points', x: [1, 2, 3], y: [1.1, 1.9, 3.2] }]}
        identityLine
        testID="pvo"
      />,
    );
    const frame = await screen.findByTestId('pvo-frame');
    await waitFor(() => expect(frame.querySelectorAll('circle')).toHaveLength(3));
    expect(screen.getByText('Observed = predicted')).toBeTruthy();
  });
});
