'use client';

import { useRouter } from 'next/navigation';

export function SignOutButton() {
  const router = useRouter();
  return (
    <button
      className="text-sm text-ink-soft hover:text-ink"
      title="Ends this account's sessions on every device"
      onClick={async () => {
        const { csrfToken } = await fetch('/api/auth/csrf').then((r) => r.json());
        await fetch('/api/auth/signout', {
          method: 'POST',
          headers: { 'content-type': 'application/x-www-form-urlencoded' },
          body: new URLSearchParams({ csrfToken, json: 'true' }),
        });
        router.push('/signin');
        router.refresh();
      }}
    >
      Sign out
    </button>
  );
}
