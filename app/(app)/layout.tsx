import Link from 'next/link';
import { SignOutButton } from '@/components/ui/sign-out-button';
import { pageUser } from '@/lib/auth/page-user';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await pageUser();
  return (
    <div className="flex min-h-screen flex-col">
      <header className="flex items-center gap-6 border-b border-rule bg-paper px-5 py-2.5">
        <Link
          href="/projects"
          className="flex items-center gap-2 font-semibold tracking-tight text-accent"
        >
          <span aria-hidden className="inline-block h-2.5 w-7 -skew-x-12 rounded-sm bg-accent" />
          Lanewise
        </Link>
        <nav className="flex gap-4 text-sm text-ink-soft">
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
        <div className="ml-auto flex items-center gap-4 text-sm">
          <Link href="/account" className="text-ink-soft hover:text-ink" data-testid="account-link">
            {user.email}
          </Link>
          <SignOutButton />
        </div>
      </header>
      <div className="flex flex-1">{children}</div>
    </div>
  );
}
