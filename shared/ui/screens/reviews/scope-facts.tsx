/** The declared scope of a recipe (structure, band, damping, excitations) as a fact list. */
import { View } from 'react-native';
import type { Scope } from '@/shared/api/approval';
import { FactRow } from '../kit/figure';

/** A declared figure as the lab wrote it (no padding zeros): 0.55, 120. */
const formatNumber = (v: number) => String(Number(v.toPrecision(6)));

export const excitationWords: Record<Scope['excitations'][number], string> = {
  random: 'random',
  'burst-random': 'burst random',
  'periodic-random': 'periodic random',
  'pseudo-random': 'pseudo-random',
  chirp: 'chirp',
  impact: 'impact',
};

export function scopeLine(scope: Scope): string {
  return `${scope.structureType} · ${formatNumber(scope.band.lowHz)}–${formatNumber(scope.band.highHz)} Hz · ζ ${formatNumber(scope.dampingPercent.min)}–${formatNumber(scope.dampingPercent.max)} %`;
}

export function ScopeFacts({ scope }: { scope: Scope }) {
  return (
    <View testID="scope-facts">
      <FactRow label="Structure type" text={scope.structureType} />
      <FactRow label="Band" text={`${formatNumber(scope.band.lowHz)} – ${formatNumber(scope.band.highHz)} Hz`} />
      <FactRow label="Damping" text={`${formatNumber(scope.dampingPercent.min)} – ${formatNumber(scope.dampingPercent.max)} % of critical`} />
      <FactRow label="Excitations" text={scope.excitations.map((e) => excitationWords[e]).join(', ')} />
    </View>
  );
}
