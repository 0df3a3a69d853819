/**
 * The validation report as a PDF (pdfkit, A4, the shipped fonts): header with the report's own
 * id, revision and sha256 (and what the revision changed), scope and purpose, the recipe with its
 * processing settings and acceptance criteria (the shared settings summary), per study and scenario the
 * set-up (system, error sources, seeds), the criteria with PASS/FAIL in words and five vector
 * plots, the justification, the signature block, the standard's dates, the evidence check, the
 * engine version, the reproducibility statement and the cautions. Every page's footer repeats the
 * report id. The document's dates are the report's creation time, so a report renders the same.
 */
import PDFDocument from 'pdfkit';
import { auditTrailLine, type ReportContent, type ReportRecord, type ReportTrail } from '@/shared/api/approval';
import type { SettingsRow } from '@/shared/api/settings-summary';
import { registerFonts } from './pdf-fonts';
import { BRASS, drawPlot, ESTIMATOR_COLOURS, INK, MOSS, type PlotSpec } from './pdf-plots';

type Doc = InstanceType<typeof PDFDocument>;
const MARGIN = 50;
const PASS = '#2E7D5B';
const FAIL = '#B3261E';
const num = (v: number | null | undefined, digits = 4) => (v === null || v === undefined || !Number.isFinite(v) ? 'n/a' : Number(v.toPrecision(digits)).toString());
const iso = (ms: number) => new Date(ms).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

function space(doc: Doc, height: number) {
  if (doc.y + height > doc.page.height - MARGIN - 20) doc.addPage();
}

function heading(doc: Doc, text: string) {
  space(doc, 40);
  doc.moveDown(0.6).font('bold').fontSize(12).fillColor(INK).text(text, MARGIN);
  const y = doc.y + 2;
  doc.save().lineWidth(0.6).strokeColor(BRASS).moveTo(MARGIN, y).lineTo(doc.page.width - MARGIN, y).stroke().restore();
  doc.moveDown(0.4);
}

function para(doc: Doc, text: string, font: 'text' | 'mono' | 'bold' = 'text', size = 9) {
  space(doc, 14);
  doc.font(font).fontSize(size).fillColor(INK).text(text, MARGIN, doc.y, { width: doc.page.width - 2 * MARGIN });
}

function field(doc: Doc, name: string, value: string, mono = false) {
  const valueWidth = doc.page.width - 2 * MARGIN - 135;
  const nameHeight = doc.font('bold').fontSize(8.5).heightOfString(name, { width: 130 });
  const valueHeight = doc.font(mono ? 'mono' : 'text').fontSize(mono ? 8 : 8.5).heightOfString(value, { width: valueWidth });
  space(doc, Math.max(nameHeight, valueHeight) + 2);
  const y = doc.y;
  doc.font('bold').fontSize(8.5).fillColor(INK).text(name, MARGIN, y, { width: 130 });
  doc.font(mono ? 'mono' : 'text').fontSize(mono ? 8 : 8.5).text(value, MARGIN + 135, y, { width: valueWidth });
  doc.y = y + Math.max(nameHeight, valueHeight, 11) + 2;
  doc.x = MARGIN;
}

/** Letters the shipped text fonts lack (checked with fontkit), spelt out so they never print as blanks. */
const SPELT: Record<string, string> = { 'κ': 'kappa', 'τ': 'tau', 'β': 'beta', '→': '->' };
const pdfSafe = (text: string) => text.replace(/[κτβ→]/g, (c) => SPELT[c]!);

const rowValue = (r: SettingsRow) => `${r.value}${r.unit && r.value !== '—' ? (r.unit === '°' ? '°' : ` ${r.unit}`) : ''}${r.note ? ` (${r.note})` : ''}`;

function settingsRows(doc: Doc, rows: SettingsRow[]) {
  for (const r of rows) field(doc, pdfSafe(r.label), pdfSafe(rowValue(r)));
}

function criteriaTable(doc: Doc, rows: ReportContent['studies'][number]['scenarios'][number]['criteria']) {
  const cols = [MARGIN, MARGIN + 230, MARGIN + 310, MARGIN + 390, MARGIN + 440];
  space(doc, 14);
  let y = doc.y;
  doc.font('bold').fontSize(8);
  ['criterion', 'limit', 'observed', 'result', 'worst line'].forEach((h, i) => doc.text(h, cols[i]!, y, { width: i === 0 ? 225 : 75, lineBreak: false }));
  y += 12;
  for (const c of rows) {
    if (y > doc.page.height - MARGIN - 40) {
      doc.addPage();
      y = doc.y;
    }
    doc.font('text').fontSize(8).fillColor(INK).text(c.label, cols[0]!, y, { width: 225 });
    const next = Math.max(doc.y, y + 11);
    doc.font('mono').fontSize(7.5).text(`${num(c.limit)} ${c.unit}`, cols[1]!, y, { width: 78, lineBreak: false });
    doc.text(`${num(c.observed)} ${c.unit}`, cols[2]!, y, { width: 78, lineBreak: false });
    doc.font('bold').fontSize(8).fillColor(c.pass ? PASS : FAIL).text(c.verdict, cols[3]!, y, { lineBreak: false });
    doc.font('mono').fontSize(7.5).fillColor(INK).text(c.worstLineHz === null ? '' : `${num(c.worstLineHz)} Hz`, cols[4]!, y, { lineBreak: false });
    y = next + 2;
  }
  doc.y = y;
  doc.x = MARGIN;
}

function plots(doc: Doc, plot: NonNullable<ReportContent['studies'][number]['scenarios'][number]['plot']>, estimator: string) {
  const colour = ESTIMATOR_COLOURS[estimator] ?? ESTIMATOR_COLOURS.H1!;
  const x = plot.frequenciesHz;
  const tol = plot.toleranceDb;
  const specs: PlotSpec[] = [
    {
      title: `FRF magnitude: exact and ${estimator} estimate (mean over seeds, 5–95 % band)`, xLabel: 'frequency, Hz', yLabel: `|H|, ${plot.unit}`, logY: true, x,
      lines: [{ label: 'exact', values: plot.exactMagnitude, colour: INK, dash: true }, { label: `${estimator} mean`, values: plot.estimatedMagnitude, colour }],
      bands: [{ label: `${estimator} 5–95 %`, low: plot.estimatedMagnitudeP5, high: plot.estimatedMagnitudeP95, colour }],
    },
    {
      title: 'Coherence (mean and 5th percentile over seeds)', xLabel: 'frequency, Hz', yLabel: 'coherence', x, yRange: [0, 1.05],
      lines: [{ label: 'mean', values: plot.meanCoherence, colour: MOSS }, { label: '5th percentile', values: plot.p5Coherence, colour: MOSS, dash: true }],
    },
    {
      title: 'Magnitude error against the exact FRF, with the tolerance', xLabel: 'frequency, Hz', yLabel: 'error, dB', x,
      lines: [{ label: 'mean error', values: plot.meanMagnitudeErrorDb, colour }, { label: '95th pct of |error|', values: plot.p95AbsMagnitudeErrorDb, colour, dash: true }],
      limits: tol === null ? [] : [{ label: `+${num(tol)} dB`, y: tol, colour: BRASS }, { label: `−${num(tol)} dB`, y: -tol, colour: BRASS }],
    },
    {
      title: 'Monte Carlo spread of the magnitude error (5th to 95th percentile)', xLabel: 'frequency, Hz', yLabel: 'error, dB', x,
      lines: [{ label: 'mean', values: plot.meanMagnitudeErrorDb, colour }],
      bands: [{ label: '5–95 %', low: plot.p5MagnitudeErrorDb, high: plot.p95MagnitudeErrorDb, colour }],
    },
    {
      title: 'Random error of |H|: predicted (Bendat & Piersol) and observed over seeds', xLabel: 'frequency, Hz', yLabel: 'normalised random error', x, logY: true,
      lines: [{ label: 'predicted', values: plot.predictedRandomError, colour: INK, dash: true }, { label: 'observed', values: plot.observedRandomError, colour }],
    },
  ];
  const width = doc.page.width - 2 * MARGIN;
  for (const spec of specs) {
    space(doc, 190);
    doc.y = drawPlot(doc, { x: MARGIN, y: doc.y + 4, width, height: 180 }, spec) + 4;
    doc.x = MARGIN;
  }
  para(doc, plot.note, 'text', 7);
}

function studySection(doc: Doc, study: ReportContent['studies'][number], estimator: string) {
  heading(doc, `Study "${study.name}": ${study.pass === null ? 'no verdict' : study.pass ? 'PASS, every criterion of every scenario' : 'FAIL, at least one criterion failed'}`);
  field(doc, 'study id', study.id, true);
  field(doc, 'engine version', study.engineVersion, true);
  field(doc, 'seeds', `${study.seedsPerScenario} per scenario, base seed ${study.baseSeed}; ${study.seedRule}`);
  field(doc, 'run by', `${study.runBy.displayName}${study.finishedAt ? `, finished ${iso(study.finishedAt)}` : ''}`);
  for (const sc of study.scenarios) {
    space(doc, 120);
    doc.moveDown(0.5);
    para(doc, `Scenario "${sc.name}" (version ${sc.version}): ${sc.verdict}`, 'bold', 10);
    field(doc, 'system', sc.system);
    field(doc, 'acquisition', sc.acquisition);
    field(doc, 'excitation', sc.excitation);
    field(doc, 'error sources', sc.errorSources.join('; '));
    field(doc, 'seeds', sc.seeds, true);
    if (sc.reference) field(doc, 'judged against', sc.reference === 'linear-frf' ? 'the exact linear FRF' : 'the exact FRF seen through the exponential window');
    const figures = Object.entries(sc.figures).map(([k, v]) => `${k} ${num(v)}`).join(', ');
    if (figures) field(doc, 'figures', figures, true);
    for (const w of sc.warnings) para(doc, `Note: ${w}`, 'text', 7.5);
    doc.moveDown(0.3);
    criteriaTable(doc, sc.criteria);
    if (sc.plot) plots(doc, sc.plot, estimator);
  }
}

/** Renders the report; resolves with the PDF bytes. */
export function renderReportPdf(record: ReportRecord, content: ReportContent, trail: ReportTrail | null = null): Promise<Buffer> {
  const created = new Date(record.createdAt);
  const doc = new PDFDocument({
    size: 'A4', margin: MARGIN, bufferPages: true,
    info: { Title: content.title, Author: content.lab.name, Subject: `Plumbline validation report ${record.id}`, Creator: 'Plumbline', CreationDate: created, ModDate: created },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  registerFonts(doc);
  const estimator = String(content.recipe.definition.estimator ?? 'H1');

  para(doc, content.lab.name, 'bold', 10);
  para(doc, content.title, 'bold', 15);
  field(doc, 'report id', record.id, true);
  field(doc, 'revision', `${record.revision} of this report`);
  field(doc, 'content sha256', record.sha256, true);
  field(doc, 'made', iso(record.createdAt));
  if (record.changes.length) field(doc, `changes in revision ${record.revision}`, pdfSafe(record.changes.join('\n')));
  if (content.standard && content.standard.status !== 'active') {
    para(doc, `This standard is ${content.standard.status.toUpperCase()}: the lab no longer cites it as current.`, 'bold', 10);
  }
  field(doc, 'engine version', content.engineVersion, true);
  field(doc, 'audit trail', auditTrailLine(trail).replace(/^audit trail: /, ''), true);

  heading(doc, 'Scope and purpose');
  para(doc, content.purpose);
  if (content.scope) {
    const s = content.scope;
    field(doc, 'structure type', s.structureType);
    field(doc, 'frequency band', `${num(s.band.lowHz)}–${num(s.band.highHz)} Hz`, true);
    field(doc, 'damping range', `${num(s.dampingPercent.min)}–${num(s.dampingPercent.max)} % of critical`, true);
    field(doc, 'excitation', s.excitations.join(', '));
  }

  heading(doc, `The recipe: "${content.recipe.name}" version ${content.recipe.version} (${content.recipe.state.replace('_', ' ')})`);
  field(doc, 'recipe id', content.recipe.id, true);
  field(doc, 'author of this version', content.recipe.author.displayName);
  heading(doc, 'Processing settings');
  settingsRows(doc, content.settings.rows.filter((r) => r.group === 'processing'));
  heading(doc, 'Acceptance criteria');
  settingsRows(doc, content.settings.rows.filter((r) => r.group === 'criteria'));

  for (const study of content.studies) studySection(doc, study, estimator);

  if (content.justification) {
    heading(doc, 'Justification of failed criteria');
    para(doc, content.justification);
  }
  heading(doc, 'Signature');
  const sig = content.signature;
  if (sig) {
    field(doc, 'signed by', sig.signer.displayName);
    field(doc, 'signer e-mail', sig.signer.email);
    field(doc, 'signer in this lab', sig.signer.origin.text);
    field(doc, 'meaning', sig.meaning);
    field(doc, 'comment', sig.comment || '(none)');
    field(doc, 'signed at', iso(sig.signedAt));
    field(doc, 'engine at signing', sig.engineVersion, true);
    field(doc, 'evidence sha256', sig.evidenceSha256, true);
    field(doc, 'signature sha256', sig.signatureSha256, true);
    field(doc, 'independence rule', sig.rule);
  } else para(doc, 'Not signed: this study is not the evidence of an approved standard.');
  if (content.standard) {
    heading(doc, 'The standard');
    field(doc, 'standard id', content.standard.id, true);
    field(doc, 'status', content.standard.status);
    field(doc, 'effective', iso(content.standard.effectiveAt));
    field(doc, 'review due', iso(content.standard.reviewDueAt));
    field(doc, 'supersedes', content.standard.supersedes ?? 'nothing', true);
    field(doc, 'superseded by', content.standard.supersededBy ?? 'nothing', true);
  }
  if (content.evidenceCheck) {
    field(doc, 'evidence now', `${content.evidenceCheck.recomputedSha256} (${content.evidenceCheck.matchesSignature ? 'matches the signed evidence' : 'DOES NOT match the signed evidence'})`, true);
  }
  heading(doc, 'Reproducibility');
  para(doc, content.reproducibility);
  heading(doc, 'Cautions');
  for (const c of content.cautions) para(doc, `• ${c}`);
  if (content.lab.footer) para(doc, content.lab.footer, 'text', 8);

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font('mono').fontSize(6.5).fillColor(INK).text(`report ${record.id} · sha256 ${record.sha256.slice(0, 16)}… · page ${i + 1} of ${range.count}`, MARGIN, doc.page.height - 30, { lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return done;
}
