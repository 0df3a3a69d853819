/**
 * The shipped fonts of the validation-report PDF (npm font packages, nothing downloaded):
 * Atkinson Hyperlegible Next (regular, bold) for text and IBM Plex Mono for numbers and units.
 *
 * fontkit 2.0.4 (used by pdfkit) reads a 10-byte glyph header even for an empty glyph; when the
 * empty glyph is the last one of the `glyf` table — the space of IBM Plex Mono — the read runs
 * past the table and throws "Offset is outside the bounds of the DataView" (foliojs/fontkit
 * issues #303 and #378). `guardEmptyGlyphs` adds the guard the upstream fix proposes: a glyph
 * with a zero-length `loca` entry has an empty control box.
 */
import fs from 'node:fs';
import type PDFDocument from 'pdfkit';

export const FONT_FILES = {
  text: require.resolve('@expo-google-fonts/atkinson-hyperlegible-next/400Regular/AtkinsonHyperlegibleNext_400Regular.ttf'),
  bold: require.resolve('@expo-google-fonts/atkinson-hyperlegible-next/700Bold/AtkinsonHyperlegibleNext_700Bold.ttf'),
  mono: require.resolve('@expo-google-fonts/ibm-plex-mono/400Regular/IBMPlexMono_400Regular.ttf'),
} as const;
export type FontName = keyof typeof FONT_FILES;

let buffers: Record<FontName, Buffer> | null = null;

interface FontkitGlyph {
  id: number;
  cbox: object;
  _font: { loca?: { offsets: number[] }; _variationProcessor?: unknown };
  _getCBox(internal?: boolean): object;
}
interface FontkitFont {
  getGlyph(id: number): FontkitGlyph;
  glyphForCodePoint(cp: number): FontkitGlyph;
}

const guarded = new WeakSet<object>();

/** Patches the TrueType glyph class of `font` once (module doc). */
function guardEmptyGlyphs(font: FontkitFont): void {
  const sample = font.glyphForCodePoint(0x41);
  const proto = Object.getPrototypeOf(sample) as FontkitGlyph;
  if (guarded.has(proto) || typeof proto._getCBox !== 'function') return;
  const original = proto._getCBox;
  const Box = sample.cbox.constructor as new (a: number, b: number, c: number, d: number) => object;
  proto._getCBox = function (this: FontkitGlyph, internal?: boolean) {
    const offsets = this._font.loca?.offsets;
    if (offsets && !this._font._variationProcessor && offsets[this.id] === offsets[this.id + 1]) return Object.freeze(new Box(0, 0, 0, 0));
    return original.call(this, internal);
  };
  guarded.add(proto);
}

/** Registers the three fonts on a document under the names text, bold and mono. */
export function registerFonts(doc: InstanceType<typeof PDFDocument>): void {
  buffers ??= {
    text: fs.readFileSync(FONT_FILES.text),
    bold: fs.readFileSync(FONT_FILES.bold),
    mono: fs.readFileSync(FONT_FILES.mono),
  };
  for (const name of Object.keys(FONT_FILES) as FontName[]) {
    doc.registerFont(name, buffers[name]);
    doc.font(name);
    guardEmptyGlyphs((doc as unknown as { _font: { font: FontkitFont } })._font.font);
  }
  doc.font('text');
}
