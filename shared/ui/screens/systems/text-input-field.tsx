/** A text input bound to a react-hook-form field, with the field's error from the resolver. */
import { useController, useFormState, type Control, type FieldValues, type Path } from 'react-hook-form';
import { TextField } from '@/shared/ui/components';
import { errorAt } from './form-rules';

interface TextInputFieldProps<T extends FieldValues> {
  control: Control<T>;
  name: Path<T>;
  label: string;
  hint?: string;
  multiline?: boolean;
  placeholder?: string;
  testID?: string;
}

export function TextInputField<T extends FieldValues>({ control, name, label, hint, multiline, placeholder, testID }: TextInputFieldProps<T>) {
  const { field } = useController({ control, name });
  const { errors } = useFormState({ control, name });
  return (
    <TextField
      label={label}
      hint={hint}
      placeholder={placeholder}
      value={typeof field.value === 'string' ? field.value : ''}
      onChangeText={field.onChange}
      onBlur={field.onBlur}
      multiline={multiline}
      numberOfLines={multiline ? 3 : undefined}
      error={errorAt(errors, name)}
      testID={testID}
    />
  );
}

/** Only analysts build systems, scenarios and recipes (the server's 'BUILDERS' roles). */
export const canBuild = (role: string | null | undefined) => role === 'analyst';
