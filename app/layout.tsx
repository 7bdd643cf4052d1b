import type { Metadata, Viewport } from 'next';
import { headers } from 'next/headers';
import localFont from 'next/font/local';
import { Providers } from './providers';
import './globals.css';

const text = localFont({
  src: [
    { path: './fonts/atkinson-hyperlegible-latin-400-normal.woff2', weight: '400' },
    { path: './fonts/atkinson-hyperlegible-latin-700-normal.woff2', weight: '700' },
  ],
  variable: '--font-text',
  display: 'swap',
});

const figures = localFont({
  src: [
    { path: './fonts/atkinson-hyperlegible-mono-latin-400-normal.woff2', weight: '400' },
    { path: './fonts/atkinson-hyperlegible-mono-latin-500-normal.woff2', weight: '500' },
  ],
  variable: '--font-figures',
  display: 'swap',
});

export const metadata: Metadata = {
  title: { default: 'Crankprint', template: '%s · Crankprint' },
  description: 'Relative compression from one crank: per-cylinder results for the job file.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

/** Picks the saved theme (or the system's) before first paint, so there is no flash. */
const themeScript = `try{var t=localStorage.getItem('crankprint-theme');if(!t)t=matchMedia('(prefers-color-scheme: dark)').matches?'dark':'light';document.documentElement.dataset.theme=t}catch(e){}`;

/** Every page renders per request: its scripts carry that request's CSP nonce (proxy.ts). */
export default async function RootLayout({ children }: { children: React.ReactNode }) {
  const h = await headers();
  const nonce = h.get('x-nonce') ?? undefined;
  return (
    <html lang="en" className={`${text.variable} ${figures.variable}`} suppressHydrationWarning>
      <head>
        <meta name="crankprint-request" content={h.get('x-request-id') ?? ''} />
        <script nonce={nonce} dangerouslySetInnerHTML={{ __html: themeScript }} />
      </head>
      <body className="min-h-screen font-sans text-base antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
