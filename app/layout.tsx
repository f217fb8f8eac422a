import type { Metadata } from 'next';
import localFont from 'next/font/local';
import Link from 'next/link';
import { headers } from 'next/headers';
import Script from 'next/script';
import { Mark } from '@/components/ui/Mark';
import { UserMenu } from '@/components/auth/UserMenu';
import './globals.css';

const plexSans = localFont({
  src: [
    { path: '../fonts/ibm-plex-sans-latin-400-normal.woff2', weight: '400', style: 'normal' },
    { path: '../fonts/ibm-plex-sans-latin-500-normal.woff2', weight: '500', style: 'normal' },
    { path: '../fonts/ibm-plex-sans-latin-600-normal.woff2', weight: '600', style: 'normal' },
  ],
  variable: '--font-plex-sans',
  display: 'swap',
});

const plexMono = localFont({
  src: [
    { path: '../fonts/ibm-plex-mono-latin-400-normal.woff2', weight: '400', style: 'normal' },
    { path: '../fonts/ibm-plex-mono-latin-500-normal.woff2', weight: '500', style: 'normal' },
  ],
  variable: '--font-plex-mono',
  display: 'swap',
});

export const metadata: Metadata = {
  title: { default: 'Tauforge', template: '%s · Tauforge' },
  description: 'Build, check, diffract and share quasicrystal models and their periodic approximants.',
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Reading the request makes every page render per request: proxy.ts gives each a fresh CSP nonce.
  const nonce = (await headers()).get('x-nonce') ?? undefined;
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans antialiased">
        {/* zod 4 probes `new Function` once to pick a faster parser; under our CSP that probe is a (caught) violation, so skip it. */}
        <Script id="zod-jitless" strategy="beforeInteractive" nonce={nonce}>{'globalThis.__zod_globalConfig = Object.assign(globalThis.__zod_globalConfig || {}, { jitless: true });'}</Script>
        <header className="border-b border-rule bg-card/80">
          <nav className="mx-auto flex max-w-6xl items-center gap-6 px-5 py-3" aria-label="Main">
            <Link href="/" className="flex items-center gap-2 font-semibold tracking-tight text-ink">
              <Mark size={30} />
              <span className="text-lg">Tauforge</span>
            </Link>
            <div className="flex flex-1 items-center gap-4 text-sm text-ink-soft">
              <Link href="/projects" className="hover:text-tide">Projects</Link>
              <Link href="/explore" className="hover:text-tide">Public models</Link>
              <Link href="/docs/model-limits" className="hover:text-tide">What the model leaves out</Link>
            </div>
            <UserMenu />
          </nav>
        </header>
        <main className="mx-auto max-w-6xl px-5 py-8">{children}</main>
        <footer className="mx-auto max-w-6xl px-5 pb-8 pt-4 text-xs text-ink-soft">
          Tauforge builds models. Compare every result with measurement before you trust it.
        </footer>
      </body>
    </html>
  );
}
