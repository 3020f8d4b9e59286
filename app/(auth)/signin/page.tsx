import Link from 'next/link';
import { safeNext } from '@/lib/auth/safe-next';
import { SignInForm } from '@/components/forms/sign-in-form';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '@/seed/demo-accounts';
import { env } from '@/lib/env';

export const metadata = { title: 'Sign in' };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ next?: string; email?: string }>;
}) {
  const { next, email } = await searchParams;
  const target = safeNext(next);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Sign in</h1>
      <SignInForm next={target} email={email} />
      <p className="text-sm text-ink-soft">
        New here?{' '}
        <Link className="text-accent underline" href={`/signup?next=${encodeURIComponent(target)}`}>
          Create an account
        </Link>
        {' · '}
        <Link className="text-accent underline" href="/reset">
          Forgot your password?
        </Link>
      </p>
      {env().LANEWISE_MODE === 'local' && (
        <aside className="rounded-lg border border-rule bg-paper-deep/60 p-4 text-sm">
          <p className="font-medium">Local demo accounts</p>
          <p className="text-ink-soft">
            Password for each: <code className="font-mono">{DEMO_PASSWORD}</code>
          </p>
          <ul className="mt-2 space-y-0.5 font-mono text-xs">
            {DEMO_ACCOUNTS.map((a) => (
              <li key={a.email}>
                {a.email} <span className="text-ink-soft">— {a.label}</span>
              </li>
            ))}
          </ul>
        </aside>
      )}
    </div>
  );
}
