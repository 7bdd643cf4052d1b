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
  Font.registerHyphenationCallback((w) => [w]);
}
