import Link from 'next/link';
import { cookies } from 'next/headers';
import { SignOutButton } from '@/components/ui/sign-out-button';
import { THEME_KEY, parseTheme } from '@/components/ui/theme';
import { ThemeToggle } from '@/components/ui/theme-toggle';
import { pageUser } from '@/lib/auth/page-user';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await pageUser();
  const theme = parseTheme((await cookies()).get(THEME_KEY)?.value);
  return (
    <div className="flex min-h-screen flex-col">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-rule bg-paper px-4 py-2.5 min-[900px]:px-5">
        <Link
          href="/projects"
          className="flex items-center gap-2 font-semibold tracking-tight text-accent"
        >
          <span aria-hidden className="inline-block h-2.5 w-7 -skew-x-12 rounded-sm bg-accent" />
          Lanewise
        </Link>
        <nav className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-soft">
          <Link href="/projects" className="hover:text-ink">
            Projects
          </Link>
          <Link href="/tools" className="hover:text-ink">
            Calculators
          </Link>
          {user.siteRole === 'admin' && (
            <>
              <Link href="/admin/users" className="hover:text-ink">
                Users
              </Link>
              <Link href="/admin/mail" className="hover:text-ink">
                Sent mail
              </Link>
            </>
          )}
        </nav>
        <div className="ml-auto flex min-w-0 items-center gap-4 text-sm">
          <ThemeToggle initial={theme} />
          <Link
            href="/account"
            className="min-w-0 truncate text-ink-soft hover:text-ink max-[899px]:max-w-40"
            data-testid="account-link"
          >
            {user.email}
          </Link>
          <SignOutButton />
        </div>
      </header>
      <div className="flex min-w-0 flex-1 flex-col min-[900px]:flex-row">{children}</div>
    </div>
  );
}
