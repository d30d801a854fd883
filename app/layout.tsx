import type { Metadata, Viewport } from 'next';
import { connection } from 'next/server';
import type { ReactNode } from 'react';
import { Providers } from '@/components/providers';
import { mono, sans } from './fonts';
import 'katex/dist/katex.min.css';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Splitfield', template: '%s · Splitfield' },
  description: 'A team notebook for jet-substructure studies.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1, themeColor: '#f7f6f2' };

export default async function RootLayout({ children }: { children: ReactNode }) {
  // Every page is rendered per request, so that Next.js can put the request's CSP nonce (proxy.ts) on its scripts.
  await connection();
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
