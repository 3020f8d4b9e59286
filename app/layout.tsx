import type { Metadata } from 'next';
import { Providers } from '@/components/providers';
import { inter, jetbrains } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Lanewise', template: '%s · Lanewise' },
  description:
    'Link star-formation tracers across surveys and measure their ordering across spiral arms.',
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${inter.variable} ${jetbrains.variable}`}>
      <body className="min-h-screen bg-paper font-sans text-ink antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
