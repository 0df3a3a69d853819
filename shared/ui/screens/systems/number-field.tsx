/**
 * A number input bound to a react-hook-form field: the text as typed stays on screen (so "1e" or
 * "0." can be finished), the form holds the number (undefined when empty, NaN when unreadable, so
 * the schema names the problem). The unit is part of the label.
 */
import { useEffect, useState } from 'react';
import { useController, useFormState, type Control, type FieldValues, type Path } from 'react-hook-form';
import { TextField } from '@/shared/ui/components';
import { errorAt } from './form-rules';

interface NumberFieldProps<T extends FieldValues> {
  control: Control<T>;
  name: Path<T>;
  label: string;
  /** Unit shown after the label, e.g. "N/m"; '' for a ratio. */
  unit: string;
  hint?: string;
  testID?: string;
}

export function parseNumber(text: string): number | undefined {
  const t = text.trim().replace(/\u2212/g, '-').replace(/,/g, '.');
  if (t === '') return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : NaN;
}

const show = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? String(v) : '');

export function NumberField<T extends FieldValues>({ control, name, label, unit, hint, testID }: NumberFieldProps<T>) {
  const { field } = useController({ control, name });
  const { errors } = useFormState({ control, name });
  const [text, setText] = useState(show(field.value));
  // A reset or a restored version replaces the value from outside: show it.
  useEffect(() => {
    setText((current) => (Object.is(parseNumber(current), field.value) ? current : show(field.value)));
  }, [field.value]);
  return (
    <TextField
      label={unit ? `${label} (${unit})` : label}
      hint={hint}
      value={text}
      inputMode="decimal"
      onChangeText={(t) => {
        setText(t);
        field.onChange(parseNumber(t));
      }}
      onBlur={field.onBlur}
      error={errorAt(errors, name)}
      testID={testID}
    />
  );
}
