/**
 * Export of a rendered plot panel on the web: its plot frames (the <svg>s react-native-svg drew),
 * their captions and the legend are stacked into one standalone SVG document; PNG draws that SVG
 * into a canvas at twice the size. Off the web these functions report that export is unavailable.
 */
import { Platform } from 'react-native';
import { colors, fontFamily } from '@/shared/ui/theme';

const SVG_NS = 'http://www.w3.org/2000/svg';
const LINE = 18;
const PAD = 12;

export const canExport = Platform.OS === 'web' && typeof document !== 'undefined';

function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', "'": '&apos;' })[c]!);
}

/**
 * One SVG document from a panel element: the title, then each part in document order — a
 * `[data-plot-caption]` becomes a line of text, a `[data-plot-frame]`'s <svg> is copied in —
 * then the legend entries (`[data-legend-label]`). Width is the widest frame.
 */
export function panelSvg(panel: Element, title: string): { svg: string; width: number; height: number } {
  const parts = Array.from(panel.querySelectorAll('[data-plot-caption], [data-plot-frame]'));
  const frames = parts.filter((p) => p.hasAttribute('data-plot-frame')).map((p) => p.querySelector('svg')).filter(Boolean) as SVGSVGElement[];
  const width = Math.max(320, ...frames.map((f) => Number(f.getAttribute('width')) || 0)) + 2 * PAD;
  const body: string[] = [];
  let y = PAD + LINE;
  body.push(text(PAD, y, title, 15, fontFamily.sansBold));
  y += LINE / 2;
  for (const part of parts) {
    if (part.hasAttribute('data-plot-caption')) {
      y += LINE;
      body.push(text(PAD, y, part.getAttribute('data-plot-caption') ?? '', 12, fontFamily.mono));
      y += 4;
      continue;
    }
    const svg = part.querySelector('svg');
    if (!svg) continue;
    const h = Number(svg.getAttribute('height')) || 0;
    body.push(`<g transform="translate(${PAD} ${y})">${svg.innerHTML}</g>`);
    y += h;
  }
  const legend = Array.from(panel.querySelectorAll('[data-legend-label]'));
  let x = PAD;
  if (legend.length) y += LINE;
  for (const item of legend) {
    const label = item.getAttribute('data-legend-label') ?? '';
    const color = item.getAttribute('data-legend-color') ?? colors.text;
    const kind = item.getAttribute('data-legend-kind');
    const advance = 36 + label.length * 7;
    if (x + advance > width - PAD) {
      x = PAD;
      y += LINE;
    }
    body.push(
      kind === 'band'
        ? `<rect x="${x}" y="${y - 9}" width="24" height="10" fill="${color}" fill-opacity="0.15" stroke="${color}" stroke-width="0.5"/>`
        : `<line x1="${x}" x2="${x + 24}" y1="${y - 4}" y2="${y - 4}" stroke="${color}" stroke-width="2"${kind === 'dashed' ? ' stroke-dasharray="6 4"' : kind === 'limit' ? ' stroke-dasharray="2 3"' : ''}/>`,
    );
    body.push(text(x + 30, y, label, 12, fontFamily.sans));
    x += advance;
  }
  const height = y + PAD;
  const svg =
    `<?xml version="1.0" encoding="UTF-8"?>\n` +
    `<svg xmlns="${SVG_NS}" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">` +
    `<rect width="100%" height="100%" fill="${colors.background}"/>${body.join('')}</svg>`;
  return { svg, width, height };
}

function text(x: number, y: number, content: string, size: number, family: string) {
  return `<text x="${x}" y="${y}" font-size="${size}" font-family="${escapeXml(family)}" fill="${colors.text}">${escapeXml(content)}</text>`;
}

/** A file name from a plot title: lower case, words joined by hyphens. */
export function exportFileName(title: string, extension: 'svg' | 'png'): string {
  const base = title.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'plot';
  return `${base}.${extension}`;
}

function download(blob: Blob, filename: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSvg(panel: Element, title: string) {
  const { svg } = panelSvg(panel, title);
  download(new Blob([svg], { type: 'image/svg+xml' }), exportFileName(title, 'svg'));
}

/** Draws the panel's SVG into a canvas (2× for sharp text) and downloads it as PNG. */
export async function downloadPng(panel: Element, title: string, scale = 2): Promise<void> {
  const { svg, width, height } = panelSvg(panel, title);
  const image = new Image();
  image.width = width;
  image.height = height;
  image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`;
  await image.decode();
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const context = canvas.getContext('2d');
  if (!context) throw new Error('This browser cannot draw the plot into an image.');
  context.scale(scale, scale);
  context.drawImage(image, 0, 0, width, height);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
  if (!blob) throw new Error('This browser could not make the PNG.');
  download(blob, exportFileName(title, 'png'));
}
