/**
 * Line plots drawn as vector paths in a pdfkit document: a frame with ticks (linear, or decades
 * on a log axis), curves broken at missing values, shaded bands (15 % of the curve's colour),
 * horizontal limit lines and a legend in words, so no plot relies on colour alone.
 */
import type PDFDocument from 'pdfkit';

type Doc = InstanceType<typeof PDFDocument>;
type Series = (number | null)[];

export const INK = '#1B2A3A';
export const BRASS = '#B07D2B';
export const ESTIMATOR_COLOURS: Record<string, string> = { H1: '#1F7A8C', H2: '#C2452D', Hv: '#6B4FA0' };
export const MOSS = '#4A7C3A';

export interface PlotSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  logY?: boolean;
  x: Series;
  lines: { label: string; values: Series; colour: string; dash?: boolean; width?: number }[];
  bands?: { label: string; low: Series; high: Series; colour: string }[];
  limits?: { label: string; y: number; colour: string }[];
  yRange?: [number, number];
}

const finite = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** A tick step of 1, 2 or 5 × 10^k giving about `count` ticks over `span`. */
export function niceStep(span: number, count = 5): number {
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}

const label = (v: number) => Number(v.toPrecision(4)).toString();

function yBounds(spec: PlotSpec): [number, number] {
  if (spec.yRange) return spec.yRange;
  const values = [...spec.lines.flatMap((l) => l.values), ...(spec.bands ?? []).flatMap((b) => [...b.low, ...b.high]), ...(spec.limits ?? []).map((l) => l.y)]
    .filter(finite)
    .filter((v) => !spec.logY || v > 0);
  if (!values.length) return spec.logY ? [1e-12, 1] : [0, 1];
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (spec.logY) return [10 ** Math.floor(Math.log10(lo)), 10 ** Math.ceil(Math.log10(hi))];
  if (hi - lo < 1e-12 * Math.max(1, Math.abs(hi))) {
    lo -= 0.5;
    hi += 0.5;
  }
  const pad = 0.05 * (hi - lo);
  return [lo - pad, hi + pad];
}

/** Draws one plot into the box (points); returns the box's bottom edge. */
export function drawPlot(doc: Doc, box: { x: number; y: number; width: number; height: number }, spec: PlotSpec): number {
  const xs = spec.x.filter(finite);
  const x0 = Math.min(...xs);
  const x1 = Math.max(...xs) > x0 ? Math.max(...xs) : x0 + 1;
  const [y0, y1] = yBounds(spec);
  const left = box.x + 46;
  const top = box.y + 16;
  const width = box.width - 56;
  const height = box.height - 52;
  const px = (v: number) => left + ((v - x0) / (x1 - x0)) * width;
  const ty = (v: number) => (spec.logY ? Math.log10(v) : v);
  const py = (v: number) => top + height - ((ty(v) - ty(y0)) / (ty(y1) - ty(y0))) * height;
  const inside = (v: number) => finite(v) && (!spec.logY || v > 0);

  doc.font('bold').fontSize(9).fillColor(INK).text(spec.title, box.x, box.y, { width: box.width, lineBreak: false });
  doc.save().lineWidth(0.5).strokeColor(INK).rect(left, top, width, height).stroke().restore();

  doc.font('mono').fontSize(6.5).fillColor(INK);
  const xStep = niceStep(x1 - x0);
  for (let v = Math.ceil(x0 / xStep) * xStep; v <= x1 + 1e-9 * xStep; v += xStep) {
    doc.save().lineWidth(0.3).strokeColor('#C8C2B4').moveTo(px(v), top).lineTo(px(v), top + height).stroke().restore();
    doc.text(label(v), px(v) - 15, top + height + 3, { width: 30, align: 'center', lineBreak: false });
  }
  const yTicks: number[] = [];
  if (spec.logY) for (let e = Math.log10(y0); e <= Math.log10(y1) + 1e-9; e++) yTicks.push(10 ** e);
  else {
    const s = niceStep(y1 - y0);
    for (let v = Math.ceil(y0 / s) * s; v <= y1 + 1e-9 * s; v += s) yTicks.push(Math.abs(v) < 1e-12 * s ? 0 : v);
  }
  for (const v of yTicks) {
    doc.save().lineWidth(0.3).strokeColor('#C8C2B4').moveTo(left, py(v)).lineTo(left + width, py(v)).stroke().restore();
    doc.text(spec.logY ? v.toExponential(0) : label(v), box.x, py(v) - 3, { width: 42, align: 'right', lineBreak: false });
  }
  doc.font('text').fontSize(7).text(spec.xLabel, left, top + height + 12, { width, align: 'center', lineBreak: false });
  doc.save().rotate(-90, { origin: [box.x + 4, top + height / 2] });
  doc.text(spec.yLabel, box.x + 4 - height / 2, top + height / 2 - 8, { width: height, align: 'center', lineBreak: false });
  doc.restore();

  doc.save().rect(left, top, width, height).clip();
  for (const b of spec.bands ?? []) {
    const idx = spec.x.map((_, i) => i).filter((i) => finite(spec.x[i]) && inside(b.low[i]!) && inside(b.high[i]!));
    if (idx.length < 2) continue;
    doc.moveTo(px(spec.x[idx[0]!]!), py(b.high[idx[0]!]!));
    for (const i of idx.slice(1)) doc.lineTo(px(spec.x[i]!), py(b.high[i]!));
    for (const i of [...idx].reverse()) doc.lineTo(px(spec.x[i]!), py(b.low[i]!));
    doc.closePath().fillColor(b.colour).fillOpacity(0.15).fill().fillOpacity(1);
  }
  for (const l of spec.limits ?? []) {
    if (!inside(l.y)) continue;
    doc.lineWidth(0.8).strokeColor(l.colour).moveTo(left, py(l.y)).lineTo(left + width, py(l.y)).stroke();
  }
  for (const line of spec.lines) {
    doc.lineWidth(line.width ?? 0.8).strokeColor(line.colour);
    if (line.dash) doc.dash(3, { space: 2 });
    let pen = false;
    spec.x.forEach((xv, i) => {
      const yv = line.values[i];
      if (!finite(xv) || !inside(yv as number)) {
        pen = false;
        return;
      }
      if (pen) doc.lineTo(px(xv), py(yv as number));
      else doc.moveTo(px(xv), py(yv as number));
      pen = true;
    });
    doc.stroke();
    doc.undash();
  }
  doc.restore();

  const legend = [...spec.lines.map((l) => ({ ...l, kind: l.dash ? 'dashed' : 'solid' })), ...(spec.bands ?? []).map((b) => ({ ...b, kind: 'shaded band', dash: false })), ...(spec.limits ?? []).map((l) => ({ ...l, kind: 'limit line', dash: false }))];
  let lx = left;
  const ly = top + height + 24;
  doc.font('text').fontSize(6.5);
  for (const item of legend) {
    doc.save().lineWidth(1.2).strokeColor(item.colour);
    if (item.dash) doc.dash(3, { space: 2 });
    doc.moveTo(lx, ly + 3).lineTo(lx + 12, ly + 3).stroke().undash().restore();
    const text = `${item.label} (${item.kind})`;
    doc.fillColor(INK).text(text, lx + 15, ly, { lineBreak: false });
    lx += 20 + doc.widthOfString(text);
  }
  return box.y + box.height;
}
