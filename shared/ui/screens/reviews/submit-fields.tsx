/** Pieces of the submit-for-review form: a labelled list of checkboxes and the scope form values. */
import { Pressable, StyleSheet, View } from 'react-native';
import { EXCITATION_KINDS, type Submission, type SubmitReviewRequest } from '@/shared/api/approval';
import { AppText } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { FieldError } from '../kit/choice-field';

export type Excitation = (typeof EXCITATION_KINDS)[number];

export const excitationWords: Record<Excitation, string> = {
  random: 'Random',
  'burst-random': 'Burst random',
  'periodic-random': 'Periodic random',
  'pseudo-random': 'Pseudo-random',
  chirp: 'Chirp',
  impact: 'Impact',
};

/** What the analyst types; numbers stay text until the schema reads them. */
export type SubmitValues = {
  recipeId: string;
  version: string;
  studyIds: string[];
  structureType: string;
  lowHz: string;
  highHz: string;
  dampingMin: string;
  dampingMax: string;
  excitations: Excitation[];
  purpose: string;
  justification: string;
};

export const emptySubmitValues: SubmitValues = {
  recipeId: '', version: '', studyIds: [], structureType: '', lowHz: '', highHz: '', dampingMin: '', dampingMax: '', excitations: [], purpose: '', justification: '',
};

/**
 * The form filled from a returned submission: its recipe at the newest version, its scope,
 * purpose and justification; its studies only when that version is still the one submitted
 * (evidence must be of exactly the version put forward).
 */
export function valuesFrom(s: Submission): SubmitValues {
  const sameVersion = s.recipe.latestVersion === s.recipe.version;
  return {
    recipeId: s.recipe.id,
    version: String(s.recipe.latestVersion),
    studyIds: sameVersion ? s.studies.map((x) => x.id) : [],
    structureType: s.scope.structureType,
    lowHz: String(s.scope.band.lowHz),
    highHz: String(s.scope.band.highHz),
    dampingMin: String(s.scope.dampingPercent.min),
    dampingMax: String(s.scope.dampingPercent.max),
    excitations: [...s.scope.excitations],
    purpose: s.purpose,
    justification: s.justification ?? '',
  };
}

/** Empty text becomes NaN so the schema says the number is missing rather than taking 0. */
const numberOf = (text: string) => (text.trim() === '' ? Number.NaN : Number(text.trim()));

export function toRequest(v: SubmitValues): SubmitReviewRequest {
  return {
    recipe: { id: v.recipeId, version: Number(v.version) },
    studyIds: v.studyIds,
    scope: {
      structureType: v.structureType,
      band: { lowHz: numberOf(v.lowHz), highHz: numberOf(v.highHz) },
      dampingPercent: { min: numberOf(v.dampingMin), max: numberOf(v.dampingMax) },
      excitations: v.excitations,
    },
    purpose: v.purpose,
    justification: v.justification.trim() === '' ? undefined : v.justification,
  };
}

/** The schema's issue paths mapped onto the form's fields. */
export function fieldOf(path: readonly PropertyKey[]): keyof SubmitValues | 'form' {
  const key = path.map(String).join('.');
  const table: Record<string, keyof SubmitValues> = {
    'recipe.id': 'recipeId', 'recipe.version': 'version', studyIds: 'studyIds', 'scope.structureType': 'structureType',
    'scope.band.lowHz': 'lowHz', 'scope.band.highHz': 'highHz', 'scope.dampingPercent.min': 'dampingMin', 'scope.dampingPercent.max': 'dampingMax',
    'scope.excitations': 'excitations', purpose: 'purpose', justification: 'justification',
  };
  return table[key] ?? (key.startsWith('studyIds') ? 'studyIds' : key.startsWith('scope.excitations') ? 'excitations' : 'form');
}

type CheckOption = { value: string; label: string; note?: string };

export function CheckList({ label, options, selected, onToggle, error, hint, emptyText, testID }: {
  label: string; options: CheckOption[]; selected: readonly string[]; onToggle: (value: string) => void; error?: string; hint?: string; emptyText?: string; testID?: string;
}) {
  return (
    <View style={styles.field} role="group" aria-label={label} testID={testID}>
      <AppText variant="smallStrong">{label}</AppText>
      {hint ? <AppText variant="small" tone="muted">{hint}</AppText> : null}
      {options.length === 0 && emptyText ? <AppText variant="body" tone="muted">{emptyText}</AppText> : null}
      {options.map((o) => {
        const on = selected.includes(o.value);
        return (
          <Pressable key={o.value} role="checkbox" aria-checked={on} aria-label={o.label} onPress={() => onToggle(o.value)} style={styles.row}>
            <View style={[styles.box, on && styles.boxOn]}>{on ? <AppText variant="smallStrong" tone="onPrimary" aria-hidden>✓</AppText> : null}</View>
            <View style={styles.rowText}>
              <AppText variant="body">{o.label}</AppText>
              {o.note ? <AppText variant="small" tone="muted">{o.note}</AppText> : null}
            </View>
          </Pressable>
        );
      })}
      <FieldError error={error} />
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.sm },
  row: { flexDirection: 'row', gap: space.sm, alignItems: 'center', paddingVertical: space.xs },
  rowText: { flex: 1 },
  box: { width: space.xl, height: space.xl, borderWidth: stroke.rule, borderColor: colors.border, borderRadius: radius.sm, alignItems: 'center', justifyContent: 'center', backgroundColor: colors.surface },
  boxOn: { backgroundColor: colors.primary, borderColor: colors.primary },
});
