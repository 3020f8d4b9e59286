import type { Metadata } from 'next';
import { cookies } from 'next/headers';
import { Providers } from '@/components/providers';
import { THEME_KEY, parseTheme, themeClass } from '@/components/ui/theme';
import { inter, jetbrains } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Lanewise', template: '%s · Lanewise' },
  description:
    'Link star-formation tracers across surveys and measure their ordering across spiral arms.',
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // The theme class comes with the HTML, so the first paint is already in the reader's theme.
  const theme = themeClass(parseTheme((await cookies()).get(THEME_KEY)?.value));
  return (
    <html
      lang="en"
      className={[inter.variable, jetbrains.variable, theme].filter(Boolean).join(' ')}
    >
      <body className="min-h-screen bg-paper font-sans text-ink antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
