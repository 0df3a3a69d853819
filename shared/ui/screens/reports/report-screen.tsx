/** The validation report as a printable page (print CSS on the web), with the PDF beside it. */
import { StyleSheet, View } from 'react-native';
import { auditTrailLine, type ReportContent, type ReportRecord, type ReportTrail } from '@/shared/api/approval';
import { reportPaths, useReport, type ReportKind } from '@/shared/ui/api/reports';
import { AppText, Button, Caution, StatusBadge } from '@/shared/ui/components';
import { useLabId } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { FactRow, formatDateTime } from '../kit/figure';
import { Panel, TextLink } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { Column } from '../kit/two-pane';
import { SettingsSummaryPanel } from '../kit/settings-summary';
import { ScopeFacts } from '../reviews/scope-facts';
import { printPage, usePrintStyle } from './print-style';
import { ReportScenario } from './report-scenario';

export function ReportScreen({ kind, targetId }: { kind: ReportKind; targetId: string }) {
  usePrintStyle();
  const labId = useLabId();
  const report = useReport(labId, kind, targetId);
  const paths = reportPaths(labId, kind, targetId);
  return (
    <Column title="Validation report">
      <View style={styles.tools} {...({ dataSet: { print: 'hide' } } as object)}>
        <Button label="Print" variant="secondary" compact onPress={printPage} />
        <TextLink href={paths.pdf} external testID="report-pdf">Download the PDF</TextLink>
        <TextLink href={kind === 'study' ? `/studies/${targetId}` : `/standards/${targetId}`}>{kind === 'study' ? 'Back to the study' : 'Back to the standard'}</TextLink>
      </View>
      <QueryView query={report} loadingLabel="Loading the report…">{(r) => <ReportBody content={r.content} record={r.report} trail={r.trail} />}</QueryView>
    </Column>
  );
}

function ReportBody({ content: c, record, trail }: { content: ReportContent; record: ReportRecord; trail: ReportTrail | null }) {
  const ended = c.standard && c.standard.status !== 'active' ? c.standard.status : null;
  return (
    <View style={styles.sheet} testID="report-sheet" {...({ dataSet: { print: 'sheet' } } as object)}>
      <View style={styles.head}>
        <AppText variant="label" tone="muted">{`${c.lab.name} · validation report`}</AppText>
        <AppText variant="title" role="heading" aria-level={1} testID="screen-title">{c.title}</AppText>
        {ended ? <StatusBadge tone="neutral" label={ended === 'retired' ? 'Retired standard' : 'Superseded standard'} /> : null}
        <AppText variant="label" tone="muted" selectable testID="report-identity">{`Report ${record.id} · revision ${record.revision} · sha256 ${record.sha256} · issued ${formatDateTime(record.createdAt)} · engine ${c.engineVersion}`}</AppText>
        <AppText variant="label" tone="muted" selectable testID="report-trail">{auditTrailLine(trail)}</AppText>
        {record.changes.length ? <AppText variant="small" testID="report-changes">{`Changed in revision ${record.revision}: ${record.changes.join('; ')}.`}</AppText> : null}
      </View>
      {ended ? (
        <Caution title={ended === 'retired' ? 'This standard is retired' : 'This standard is superseded'} testID="report-ended">
          {ended === 'retired' ? 'The lab no longer cites it as current. The report stays as the record of what was approved.' : 'A newer version of the recipe is the lab\'s standard now. The report stays as the record of what was approved.'}
        </Caution>
      ) : null}
      {c.purpose ? <AppText variant="body">{c.purpose}</AppText> : null}
      {c.scope ? <Panel title="Scope"><ScopeFacts scope={c.scope} /></Panel> : null}
      <Panel title="Recipe">
        <FactRow label="Recipe" text={`${c.recipe.name} v${c.recipe.version}`} />
        <FactRow label="Author" text={c.recipe.author.displayName} />
        <FactRow label="State" text={c.recipe.state.replace('_', ' ')} />
      </Panel>
      <SettingsSummaryPanel summary={c.settings} />
      {c.studies.map((study) => (
        <Panel key={study.id} title={study.name} aside={<StatusBadge tone={study.pass ? 'pass' : study.pass === false ? 'fail' : 'neutral'} label={study.pass ? 'PASS' : study.pass === false ? 'FAIL' : study.status} />}>
          <AppText variant="small" tone="muted">{`Run by ${study.runBy.displayName} · ${formatDateTime(study.startedAt)} – ${formatDateTime(study.finishedAt)} · ${study.seedsPerScenario} seeds per scenario, base seed ${study.baseSeed} · ${study.seedRule} · engine ${study.engineVersion}`}</AppText>
          {study.scenarios.map((s) => <ReportScenario key={s.id} scenario={s} />)}
        </Panel>
      ))}
      {c.justification ? <Panel title="Justification"><AppText variant="body">{c.justification}</AppText></Panel> : null}
      {c.signature ? (
        <Panel title="Signature">
          <FactRow label="Reviewer" text={`${c.signature.signer.displayName} (${c.signature.signer.email})`} />
          <FactRow label="In the lab by" text={c.signature.signer.origin.text} />
          <FactRow label="Signed" text={formatDateTime(c.signature.signedAt)} />
          <AppText variant="body">{`Meaning: ${c.signature.meaning}`}</AppText>
          <AppText variant="small" tone="muted" testID="signature-rule">{c.signature.rule}</AppText>
          <AppText variant="label" tone="muted" selectable>{`evidence sha256 ${c.signature.evidenceSha256}`}</AppText>
          <AppText variant="label" tone="muted" selectable>{`signature sha256 ${c.signature.signatureSha256}`}</AppText>
        </Panel>
      ) : null}
      {c.evidenceCheck ? (
        <Panel title="Evidence check" aside={<StatusBadge tone={c.evidenceCheck.matchesSignature ? 'pass' : 'fail'} label={c.evidenceCheck.matchesSignature ? 'Matches the signature' : 'Does not match'} />}>
          <AppText variant="label" tone="muted" selectable>{`recomputed sha256 ${c.evidenceCheck.recomputedSha256}`}</AppText>
        </Panel>
      ) : null}
      <Panel title="Reproducibility"><AppText variant="body">{c.reproducibility}</AppText></Panel>
      <View style={styles.cautions}>{c.cautions.map((text) => <Caution key={text}>{text}</Caution>)}</View>
      {c.lab.footer ? <AppText variant="small" tone="muted">{c.lab.footer}</AppText> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  tools: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.lg, width: '100%', maxWidth: 680, alignSelf: 'center' },
  // Paper width: a printed A4 page (minus margins) holds about 680 CSS px, so plots measured on
  // screen at this width print whole.
  sheet: { gap: space.lg, width: '100%', maxWidth: 680, alignSelf: 'center' },
  head: { gap: space.sm },
  cautions: { gap: space.sm },
});
