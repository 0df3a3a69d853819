/**
 * The sign-off dialog: approve with the reviewer's password entered again, a stated meaning and a
 * comment, or return with a reason. Checked with the server's decideSchema before it is sent.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { Controller, useForm, type Resolver } from 'react-hook-form';
import { View, StyleSheet } from 'react-native';
import { decideSchema, type DecideRequest, type Submission } from '@/shared/api/approval';
import { useDecide } from '@/shared/ui/api/reviews';
import { AppText, TextField } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { ChoiceChips } from '../kit/choice-field';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { scopeLine } from './scope-facts';

export type Decision = 'approved' | 'returned';

/** One flat form for both decisions; the discriminated schema ignores the other decision's fields. */
type Fields = { decision: Decision; password: string; meaning: string; comment: string; reason: string; reviewMonths: number | undefined };

const resolver = zodResolver(decideSchema) as unknown as Resolver<Fields>;

type Props = { labId: string; submission: Submission; decision: Decision | null; onClose: () => void };

export function SignOffDialog({ labId, submission, decision, onClose }: Props) {
  const decide = useDecide(labId, submission.id);
  const { control, handleSubmit, watch, reset, setValue, formState: { errors } } = useForm<Fields>({
    resolver,
    defaultValues: { decision: decision ?? 'approved', password: '', meaning: '', comment: '', reason: '', reviewMonths: 12 },
  });
  // The dialog starts clean each time it opens with a decision (the mutation's reset is stable).
  const resetDecision = decide.reset;
  useEffect(() => {
    if (decision) {
      reset({ decision, password: '', meaning: '', comment: '', reason: '', reviewMonths: 12 });
      resetDecision();
    }
  }, [decision, reset, resetDecision]);
  const chosen = watch('decision');
  const approving = chosen === 'approved';
  const submit = handleSubmit((values) => {
    const request: DecideRequest = approving
      ? { decision: 'approved', password: values.password, meaning: values.meaning, comment: values.comment, reviewMonths: values.reviewMonths }
      : { decision: 'returned', reason: values.reason, comment: values.comment };
    decide.mutate(request, { onSuccess: onClose });
  });
  return (
    <ConfirmDialog
      visible={decision !== null}
      title={approving ? 'Sign off this recipe version' : 'Return it to the author'}
      confirmLabel={approving ? 'Sign and approve' : 'Return with this reason'}
      busyLabel={approving ? 'Signing…' : 'Returning…'}
      busy={decide.isPending}
      error={decide.error}
      onCancel={onClose}
      onConfirm={() => void submit()}
      testID="sign-off-dialog"
    >
      <View style={styles.fields}>
        <AppText variant="small" tone="muted">{`${submission.recipe.name} v${submission.recipe.version} · ${scopeLine(submission.scope)}`}</AppText>
        <ChoiceChips
          label="Decision"
          value={chosen}
          options={[{ value: 'approved', label: 'Approve' }, { value: 'returned', label: 'Return' }]}
          onChange={(d) => setValue('decision', d)}
        />
        {approving ? (
          <>
            <Controller control={control} name="meaning" render={({ field }) => (
              <TextField label="What your signature means" hint="e.g. “Approved as the lab standard for lightly damped frames, 20–120 Hz”." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.meaning?.message} multiline testID="sign-meaning" />
            )} />
            <Controller control={control} name="reviewMonths" render={({ field }) => (
              <TextField label="Review falls due after (months)" value={field.value === undefined || Number.isNaN(field.value) ? '' : String(field.value)} onChangeText={(t) => field.onChange(t.trim() === '' ? undefined : Number(t))} inputMode="numeric" error={errors.reviewMonths ? 'Enter a whole number of months, 1 to 60' : undefined} />
            )} />
          </>
        ) : (
          <Controller control={control} name="reason" render={({ field }) => (
            <TextField label="Reason for returning it" hint="The author reads this; say what is missing or wrong." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.reason?.message} multiline testID="return-reason" />
          )} />
        )}
        <Controller control={control} name="comment" render={({ field }) => (
          <TextField label="Comment (optional)" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.comment?.message} multiline />
        )} />
        {approving ? (
          <>
            <Controller control={control} name="password" render={({ field }) => (
              <TextField label="Your password" hint="Entered again for this signature; it is checked, not stored with it." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.password?.message} secureTextEntry autoComplete="current-password" testID="sign-password" />
            )} />
            <AppText variant="small" tone="muted">
              Your name, the meaning, the comment, the time and a hash of the evidence are recorded together. An approved version cannot be changed; an edit makes a new version.
            </AppText>
          </>
        ) : null}
      </View>
    </ConfirmDialog>
  );
}

const styles = StyleSheet.create({ fields: { gap: space.md } });
