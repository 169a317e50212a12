import { readFileSync } from 'node:fs';
import * as fontkit from 'fontkit';
import { LRUCache } from 'lru-cache';
import { join, dirname } from 'node:path';
import { woffToSfnt } from './woff-to-sfnt';

/**
 * Inter as @fontsource ships it: one file per Unicode subset. Latin lacks Ω, τ and χ (greek has
 * them) and latin-ext holds the accented letters of names and addresses, so text is split into
 * runs by the first subset whose published Unicode range (the package's unicode.json) holds each
 * character. What no Inter subset holds — superscripts (10⁻⁶, cm⁻¹), subscripts, ∞, ≤, √ — is drawn
 * with DejaVu Sans (@fontsource/dejavu-sans, whose one file carries them), so R∞ and 10⁻⁶ print as
 * such and copy out of the PDF as the same characters. The .woff files (pdfkit cannot read .woff2)
 * are unpacked and parsed once per thread: every report reuses the same parsed fonts, whose tables
 * (and the shaping plans fontkit builds from them) would otherwise be decoded again per report.
 */
export type InterWeight = 400 | 600 | 700;

const SUBSETS = ['latin', 'greek', 'latin-ext'] as const;
const WEIGHTS: InterWeight[] = [400, 600, 700];

/** The subset name under which DejaVu Sans draws what Inter's subsets lack. */
export const FALLBACK_SUBSET = 'symbols';

function packageDir(): string {
  return dirname(require.resolve('@fontsource/inter/package.json'));
}

function fallbackFile(weight: InterWeight): string {
  // DejaVu Sans ships 400 and 700; a semibold run takes the bold symbols.
  const file = `dejavu-sans-latin-${weight === 400 ? 400 : 700}-normal.woff`;
  return join(dirname(require.resolve('@fontsource/dejavu-sans/package.json')), 'files', file);
}

function filesDir(): string {
  return join(packageDir(), 'files');
}

/** Parses a CSS unicode-range list such as "U+0000-00FF,U+0131". */
export function parseUnicodeRange(list: string): Array<[number, number]> {
  return list.split(',').map((part) => {
    const [from, to] = part.trim().replace(/^U\+/i, '').split('-');
    return [parseInt(from, 16), parseInt(to ?? from, 16)];
  });
}

export function fontName(subset: string, weight: InterWeight): string {
  return `inter-${subset}-${weight}`;
}

interface LoadedSubset {
  subset: string;
  covers: (codePoint: number) => boolean;
}

let loaded: LoadedSubset[] | null = null;

function subsets(): LoadedSubset[] {
  if (!loaded) {
    const ranges = JSON.parse(readFileSync(join(packageDir(), 'unicode.json'), 'utf8')) as Record<string, string>;
    loaded = SUBSETS.map((subset) => {
      const spans = parseUnicodeRange(ranges[subset]);
      return { subset, covers: (cp: number) => spans.some(([from, to]) => cp >= from && cp <= to) };
    });
  }
  return loaded;
}

const parsed = new Map<string, fontkit.Font>();

/**
 * The parsed font (pdfkit takes a fontkit font as it takes the file's bytes). Each document still
 * makes its own subset of the glyphs it uses; what is shared is read-only: the decoded tables and
 * fontkit's caches of glyphs and layouts.
 */
function parsedFont(subset: string, weight: InterWeight): fontkit.Font {
  const name = fontName(subset, weight);
  let font = parsed.get(name);
  if (!font) {
    const path = subset === FALLBACK_SUBSET ? fallbackFile(weight) : join(filesDir(), `inter-${subset}-${weight}-normal.woff`);
    font = withSharedLayouts(fontkit.create(woffToSfnt(readFileSync(path))) as fontkit.Font);
    parsed.set(name, font);
  }
  return font;
}

/** Words laid out per font and thread; a report's vocabulary repeats, its numbers vary. */
const LAYOUTS_KEPT = 4000;

/**
 * The font, answering `layout` from a cache of earlier answers. Shaping a word (OpenType
 * substitutions and kerning) is most of a report's rendering time, and pdfkit caches it only per
 * document. Laying out the same text with the same features always gives the same glyphs and
 * positions; pdfkit scales the positions it is given in place, so each answer is a fresh copy.
 */
function withSharedLayouts(font: fontkit.Font): fontkit.Font {
  const layouts = new LRUCache<string, fontkit.GlyphRun>({ max: LAYOUTS_KEPT });
  const shaped = Object.create(font) as fontkit.Font;
  shaped.layout = function (this: fontkit.Font, ...args: Parameters<fontkit.Font['layout']>): fontkit.GlyphRun {
    const key = JSON.stringify(args);
    let run = layouts.get(key);
    if (!run) {
      run = font.layout.apply(this, args);
      layouts.set(key, run);
    }
    return copyRun(run);
  } as fontkit.Font['layout'];
  return shaped;
}

function copyRun(run: fontkit.GlyphRun): fontkit.GlyphRun {
  const copy = Object.assign(Object.create(Object.getPrototypeOf(run) as object) as fontkit.GlyphRun, run);
  copy.glyphs = [...run.glyphs];
  copy.positions = run.positions.map((p) => Object.assign(Object.create(Object.getPrototypeOf(p) as object) as fontkit.GlyphPosition, p));
  return copy;
}

/** Drops the parsed fonts and their layouts (tests compare a cold render with a warm one). */
export function forgetParsedFonts(): void {
  parsed.clear();
}

/** Registers every subset and weight on a document under the names `fontName()` returns. */
export function registerInter(doc: PDFKit.PDFDocument): void {
  for (const subset of [...subsets().map((s) => s.subset), FALLBACK_SUBSET]) {
    // pdfkit 0.20 accepts a parsed fontkit font where its types say only bytes or a path
    for (const weight of WEIGHTS) doc.registerFont(fontName(subset, weight), parsedFont(subset, weight) as unknown as Buffer);
  }
}

export interface TextRun {
  subset: string;
  text: string;
}

/** Splits text into runs each drawable with one subset; whitespace joins the run before it. */
export function splitIntoRuns(text: string): TextRun[] {
  const all = subsets();
  const runs: TextRun[] = [];
  for (const ch of text) {
    const cp = ch.codePointAt(0) ?? 0;
    const isSpace = /\s/.test(ch);
    const previous = runs[runs.length - 1];
    const subset = isSpace && previous ? previous.subset : (all.find((s) => s.covers(cp))?.subset ?? FALLBACK_SUBSET);
    if (previous && previous.subset === subset) previous.text += ch;
    else runs.push({ subset, text: ch });
  }
  return runs;
}
