/** Uploads: the form and the lab's uploads; /uploads/:id shows one result. */
import { StyleSheet, View } from 'react-native';
import { useUploadResult, useUploads } from '@/shared/ui/api/uploads';
import { AppText, EmptyState } from '@/shared/ui/components';
import { useCurrentLab } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { PageHead, Panel, RowLink, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { TwoPane } from '../kit/two-pane';
import { UploadForm } from './upload-form';
import { UploadResultView } from './upload-result';

export function UploadsScreen({ uploadId }: { uploadId?: string }) {
  const lab = useCurrentLab();
  const labId = lab?.labId ?? '';
  const uploads = useUploads(labId);
  const list = (
    <View style={styles.col}>
      <PageHead title="Uploads" eyebrow="Work" intro="Run your own time data through a recipe, or score an FRF your acquisition software made against a scenario's exact FRF." actions={<TextLink href="/studies">Studies</TextLink>} />
      {lab?.role === 'analyst' ? <Panel title="Upload a CSV"><UploadForm labId={labId} /></Panel> : <AppText variant="small" tone="muted">Analysts upload files; you can read every upload.</AppText>}
      <QueryView query={uploads} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No uploads yet', body: 'Files the lab uploads are kept with their hash and can be recomputed at any time.' }}>
        {(d) => (
          <View style={styles.rows} testID="upload-list">
            {d.items.map((u) => (
              <RowLink key={u.id} href={`/uploads/${u.id}`} label={u.originalName} active={u.id === uploadId}>
                <View style={styles.flex}>
                  <AppText variant="bodyStrong">{u.originalName}</AppText>
                  <AppText variant="small" tone="muted">{`${u.kind === 'frf' ? 'FRF to score' : 'Time data'} · ${(u.sizeBytes / 1024).toFixed(1)} KiB · ${u.createdBy.displayName}, ${formatDateTime(u.createdAt)}`}</AppText>
                </View>
              </RowLink>
            ))}
          </View>
        )}
      </QueryView>
    </View>
  );
  const detail = uploadId ? <UploadDetail labId={labId} uploadId={uploadId} /> : <EmptyState title="Choose an upload" body="Its FRF and scores open here." />;
  return <TwoPane title="Uploads" list={list} detail={detail} phoneShowsList={!uploadId} />;
}

function UploadDetail({ labId, uploadId }: { labId: string; uploadId: string }) {
  const result = useUploadResult(labId, uploadId);
  return (
    <View style={styles.col}>
      <TextLink href="/uploads">All uploads</TextLink>
      <QueryView query={result} loadingLabel="Recomputing the upload…">
        {(r) => (
          <>
            <PageHead title={r.upload.originalName} eyebrow={r.upload.kind === 'frf' ? 'FRF scored' : 'Time data processed'} intro={`sha256 ${r.upload.sha256.slice(0, 16)}… · ${formatDateTime(r.upload.createdAt)}`} />
            <UploadResultView result={r} />
          </>
        )}
      </QueryView>
    </View>
  );
}

const styles = StyleSheet.create({ col: { gap: space.lg }, rows: { gap: space.sm }, flex: { flex: 1, gap: space.xs } });
