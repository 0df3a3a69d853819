import { StatusBadge, type StatusTone } from '@/shared/ui/components';
import type { StudyStatus } from '@/shared/api/work';

/** Pass / fail / not yet, always as a word with its mark. */
export function Verdict({ pass, testID }: { pass: boolean | null | undefined; testID?: string }) {
  if (pass === true) return <StatusBadge tone="pass" label="Pass" testID={testID} />;
  if (pass === false) return <StatusBadge tone="fail" label="Fail" testID={testID} />;
  return <StatusBadge tone="neutral" label="No verdict yet" testID={testID} />;
}

const studyTone: Record<StudyStatus, StatusTone> = {
  queued: 'neutral',
  running: 'neutral',
  // Finished says nothing about the verdict, so it is not drawn in the pass colour.
  finished: 'neutral',
  failed: 'fail',
  cancelled: 'warning',
};
export const studyStatusWords: Record<StudyStatus, string> = {
  queued: 'Queued',
  running: 'Running',
  finished: 'Finished',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

export function StudyStatusBadge({ status, testID }: { status: StudyStatus; testID?: string }) {
  return <StatusBadge tone={studyTone[status]} label={studyStatusWords[status]} testID={testID} />;
}
