import Link from 'next/link';
import { safeNext } from '@/lib/auth/safe-next';
import { SignUpForm } from '@/components/forms/sign-up-form';

export const metadata = { title: 'Create an account' };

export default async function SignUpPage({
  searchParams,
}: {
  searchParams: Promise<{ next?: string; email?: string }>;
}) {
  const { next, email } = await searchParams;
  const target = safeNext(next);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Create an account</h1>
      <SignUpForm next={target} email={email} />
      <p className="text-sm text-ink-soft">
        Have an account?{' '}
        <Link className="text-accent underline" href={`/signin?next=${encodeURIComponent(target)}`}>
          Sign in
        </Link>
      </p>
    </div>
  );
}
