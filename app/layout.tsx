import type { Metadata, Viewport } from 'next';
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

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
