/** Fonts shipped with the app, registered once for the PDF renderer (.woff; .woff2 is not read by it). */
import { join } from 'node:path';
import { Font } from '@react-pdf/renderer';

let done = false;

export function registerPdfFonts(): void {
  if (done) return;
  done = true;
  const dir = join(/*turbopackIgnore: true*/ process.cwd(), 'app', 'fonts');
  Font.register({
    family: 'Atkinson',
    fonts: [
      { src: join(dir, 'atkinson-hyperlegible-latin-400-normal.woff'), fontWeight: 400 },
      { src: join(dir, 'atkinson-hyperlegible-latin-700-normal.woff'), fontWeight: 700 },
    ],
  });
  Font.register({
    family: 'AtkinsonMono',
    fonts: [
      { src: join(dir, 'atkinson-hyperlegible-mono-latin-400-normal.woff'), fontWeight: 400 },
      { src: join(dir, 'atkinson-hyperlegible-mono-latin-500-normal.woff'), fontWeight: 500 },
    ],
  });
  // Glyph fallbacks (app/fonts/FONTS.md): Chinese, Japanese and Korean, then emoji.
  Font.register({ family: 'CJKFallback', src: join(dir, 'droid-sans-fallback.ttf') });
  Font.register({ family: 'EmojiFallback', src: join(dir, 'noto-emoji-400-normal.woff') });
  Font.registerHyphenationCallback((w) => [w]);
}

/** The report's text families, each followed by the fallbacks for characters it does not have. */
export const TEXT_FONTS = ['Atkinson', 'CJKFallback', 'EmojiFallback'];
export const MONO_FONTS = ['AtkinsonMono', 'CJKFallback', 'EmojiFallback'];
