/** What an upload gave: time data as H1/H2/Hv with coherence; an FRF with its scores plotted. */
import { StyleSheet, View } from 'react-native';
import type { UploadResult } from '@/shared/api/work';
import { AppText } from '@/shared/ui/components';
import { FrfPlot, LinePlot } from '@/shared/ui/plots';
import { curveColors, space } from '@/shared/ui/theme';
import { FactRow } from '../kit/figure';
import { Panel } from '../kit/panel';
import { toFloat } from '../studies/seed-frf';

const summaryWords: Record<string, string> = {
  lines: 'Lines scored',
  undefinedLines: 'Lines without a score (exact FRF zero)',
  bandLowHz: 'Band from',
  bandHighHz: 'Band to',
  maxAbsMagnitudeDb: 'Largest |magnitude error|',
  worstMagnitudeHz: 'at',
  rmsMagnitudeDb: 'RMS magnitude error',
  maxAbsPhaseDeg: 'Largest |phase error|',
  worstPhaseHz: 'at',
  maxComplexRelative: 'Largest complex relative error',
  worstComplexHz: 'at',
};
/** A summary key's unit from its name (the server names them …Hz, …Db, …Deg). */
export const summaryUnit = (key: string) => (/Hz$/.test(key) ? 'Hz' : /Db$/.test(key) ? 'dB' : /Deg$/.test(key) ? '°' : '');
const summaryLabel = (key: string) => summaryWords[key] ?? key.replace(/([A-Z])/g, ' $1').toLowerCase();

const complex = (c: { re: (number | null)[]; im: (number | null)[] }) => ({ re: toFloat(c.re), im: toFloat(c.im) });

export function UploadResultView({ result }: { result: UploadResult }) {
  const r = result.result;
  const f = toFloat(r.frequenciesHz);
  if (r.kind === 'time-data') {
    const unit = r.unit ? `${r.unit}/N` : 'output unit/N';
    return (
      <View style={styles.wrap} testID="upload-result">
        <Panel title="Processing">
          <FactRow label="Sample rate" value={r.sampleRateHz} unit="Hz" />
          <FactRow label="Samples" value={r.samples} unit="" />
          <FactRow label="Block length" value={r.blockLength} unit="samples" />
          <FactRow label="Averages (effective)" text={`${r.averages} (${r.effectiveAverages.toFixed(1)})`} />
          {r.warnings.map((w) => <AppText key={w} variant="small" tone="muted">{`Note: ${w}`}</AppText>)}
        </Panel>
        <FrfPlot title="Your FRF: H1, H2 and Hv" subtitle="From your time data, processed by the recipe" unit={unit} testID="upload-frf"
          curves={[
            { id: 'h1', label: 'H1', color: curveColors.h1, frequenciesHz: f, frf: complex(r.h1) },
            { id: 'h2', label: 'H2', color: curveColors.h2, frequenciesHz: f, frf: complex(r.h2) },
            { id: 'hv', label: 'Hv', color: curveColors.hv, frequenciesHz: f, frf: complex(r.hv) },
          ]} />
        <LinePlot title="Coherence" x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }} y={{ kind: 'linear', label: 'Coherence γ²', unit: '(ratio)', domain: [0, 1.02] }}
          series={[{ id: 'coh', label: 'Coherence', color: curveColors.coherence, x: f, y: toFloat(r.coherence), unit: '' }]} xScaleToggle />
      </View>
    );
  }
  return (
    <View style={styles.wrap} testID="upload-result">
      <Panel title="Scores against the exact FRF">
        {Object.entries(r.summary).map(([key, value]) => <FactRow key={key} label={summaryLabel(key)} value={value} unit={summaryUnit(key)} />)}
      </Panel>
      <FrfPlot title="Your FRF against the exact one" unit={r.unit} testID="upload-frf"
        curves={[
          { id: 'exact', label: 'Exact FRF', color: curveColors.exact, dashed: true, frequenciesHz: f, frf: complex(r.exact) },
          { id: 'uploaded', label: 'Uploaded FRF', color: curveColors.h1, frequenciesHz: f, frf: complex(r.uploaded) },
        ]} />
      <LinePlot title="Magnitude error" x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }} y={{ kind: 'linear', label: 'Magnitude error', unit: 'dB' }}
        series={[{ id: 'mag', label: 'Uploaded minus exact', color: curveColors.h1, x: f, y: toFloat(r.magnitudeErrorDb) }]} xScaleToggle testID="upload-score" />
      <LinePlot title="Phase error" x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }} y={{ kind: 'linear', label: 'Phase error', unit: '°' }}
        series={[{ id: 'phase', label: 'Uploaded minus exact', color: curveColors.h1, x: f, y: toFloat(r.phaseErrorDeg) }]} xScaleToggle />
    </View>
  );
}

const styles = StyleSheet.create({ wrap: { gap: space.lg } });
