/** Force over response against time, one crosshair and zoom for both (a stretch of a simulated record). */
import { useMemo } from 'react';
import { nearestIndex, PlotCaption, PlotFrame, PlotPanel, usePlotView, formatWithUnit } from '@/shared/ui/plots';
import { curveColors } from '@/shared/ui/theme';

interface SignalsPlotProps {
  title: string;
  subtitle?: string;
  timeS: Float64Array;
  input: Float64Array;
  output: Float64Array;
  outputUnit: string;
  testID?: string;
}

export function SignalsPlot({ title, subtitle, timeS, input, output, outputUnit, testID }: SignalsPlotProps) {
  const full = useMemo<[number, number]>(() => [0, timeS.length > 1 ? timeS[timeS.length - 1] : 1], [timeS]);
  const view = usePlotView(full, 'linear');
  const force = useMemo(() => [{ id: 'force', label: 'Force', color: curveColors.h1, x: timeS, y: input }], [timeS, input]);
  const response = useMemo(() => [{ id: 'response', label: 'Response', color: curveColors.h2, x: timeS, y: output }], [timeS, output]);
  const at = view.cursorX;
  const i = at === null ? -1 : nearestIndex(timeS, at);
  const readout =
    i < 0
      ? { heading: null, rows: [] }
      : {
          heading: { label: 'Time', text: formatWithUnit(timeS[i], 's') },
          rows: [
            { id: 'force', label: 'Force', color: curveColors.h1, text: formatWithUnit(input[i], 'N') },
            { id: 'response', label: 'Response', color: curveColors.h2, text: formatWithUnit(output[i], outputUnit) },
          ],
        };
  const x = { kind: 'linear' as const, label: 'Time', unit: 's', domain: view.domain };
  return (
    <PlotPanel
      title={title}
      subtitle={subtitle}
      view={view}
      legend={[
        { id: 'force', label: 'Force', color: curveColors.h1, kind: 'line' },
        { id: 'response', label: 'Response', color: curveColors.h2, kind: 'line' },
      ]}
      readout={readout}
      testID={testID}
    >
      {(width) => (
        <>
          <PlotCaption text="Force · N" />
          <PlotFrame width={width} height={130} x={x} y={{ kind: 'linear', label: 'Force', unit: 'N' }} series={force} cursorX={at} selection={view.selection} interaction={view.interaction} label={`${title}: force in N against time in s`} testID={testID ? `${testID}-force` : undefined} />
          <PlotCaption text={`Response · ${outputUnit}`} />
          <PlotFrame width={width} height={130} x={x} y={{ kind: 'linear', label: 'Response', unit: outputUnit }} series={response} cursorX={at} selection={view.selection} interaction={view.interaction} label={`${title}: response in ${outputUnit} against time in s`} testID={testID ? `${testID}-response` : undefined} />
          <PlotCaption text="Time · s" />
        </>
      )}
    </PlotPanel>
  );
}
