/** Register filters: which standard covers a structure like this (type, band, damping, excitation). */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { EXCITATION_KINDS } from '@/shared/api/approval';
import type { StandardFilter } from '@/shared/ui/api/standards';
import { Button, TextField } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { ChoiceChips, SelectField } from '../kit/choice-field';
import { excitationWords } from '../reviews/scope-facts';

const num = (t: string) => {
  const v = Number(t.trim());
  return t.trim() === '' || !Number.isFinite(v) ? undefined : v;
};

type Draft = { structureType: string; lowHz: string; highHz: string; dampingPercent: string; excitation: string; status: 'active' | 'all' };
const blank: Draft = { structureType: '', lowHz: '', highHz: '', dampingPercent: '', excitation: '', status: 'active' };

/** The filter a draft stands for; numbers that do not parse are reported, not sent. */
export function filterOf(d: Draft): { filter: StandardFilter; problems: Partial<Record<keyof Draft, string>> } {
  const problems: Partial<Record<keyof Draft, string>> = {};
  for (const key of ['lowHz', 'highHz', 'dampingPercent'] as const) if (d[key].trim() !== '' && num(d[key]) === undefined) problems[key] = 'Enter a number';
  const filter: StandardFilter = {
    structureType: d.structureType.trim() || undefined,
    lowHz: num(d.lowHz),
    highHz: num(d.highHz),
    dampingPercent: num(d.dampingPercent),
    excitation: (d.excitation || undefined) as StandardFilter['excitation'],
    status: d.status,
  };
  return { filter, problems };
}

export function StandardFilters({ onApply }: { onApply: (filter: StandardFilter) => void }) {
  const [draft, setDraft] = useState<Draft>(blank);
  const [problems, setProblems] = useState<Partial<Record<keyof Draft, string>>>({});
  const set = (key: keyof Draft) => (value: string) => setDraft((d) => ({ ...d, [key]: value }));
  const apply = () => {
    const { filter, problems: found } = filterOf(draft);
    setProblems(found);
    if (Object.keys(found).length === 0) onApply(filter);
  };
  return (
    <View style={styles.form} testID="standard-filters">
      <TextField label="Structure type" hint="Part of the type, e.g. “frame”." value={draft.structureType} onChangeText={set('structureType')} />
      <View style={styles.row}>
        <View style={styles.flex}><TextField label="Band from (Hz)" value={draft.lowHz} onChangeText={set('lowHz')} inputMode="decimal" error={problems.lowHz} /></View>
        <View style={styles.flex}><TextField label="to (Hz)" value={draft.highHz} onChangeText={set('highHz')} inputMode="decimal" error={problems.highHz} /></View>
      </View>
      <TextField label="Damping of the structure (% of critical)" value={draft.dampingPercent} onChangeText={set('dampingPercent')} inputMode="decimal" error={problems.dampingPercent} />
      <SelectField label="Excitation" emptyLabel="Any excitation" value={draft.excitation || undefined} options={EXCITATION_KINDS.map((e) => ({ value: e, label: excitationWords[e] }))} onChange={set('excitation')} />
      <ChoiceChips label="Status" value={draft.status} options={[{ value: 'active', label: 'Active only' }, { value: 'all', label: 'All, with retired and superseded' }]} onChange={(v) => setDraft((d) => ({ ...d, status: v }))} />
      <View style={styles.row}>
        <Button label="Apply filters" variant="secondary" compact onPress={apply} testID="apply-filters" />
        <Button label="Clear" variant="secondary" compact onPress={() => { setDraft(blank); setProblems({}); onApply({}); }} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  flex: { flex: 1, minWidth: 120 },
});
