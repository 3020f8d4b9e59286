/**
 * Signs in through next-auth's credentials endpoint from the browser. Written out (instead of
 * next-auth/react's signIn) so that a refusal (the 429 of a rate limit) reaches the form as a message.
 */
export async function signInWithPassword(email: string, password: string): Promise<string | null> {
  const csrf = await fetch('/api/auth/csrf').then(
    (r) => r.json() as Promise<{ csrfToken: string }>,
  );
  const res = await fetch('/api/auth/callback/credentials', {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
    body: new URLSearchParams({ csrfToken: csrf.csrfToken, email, password, json: 'true' }),
  });
  const body = (await res.json().catch(() => null)) as {
    url?: string;
    error?: { message?: string };
  } | null;
  // Our own refusals (limits, a malformed form) carry a message for the form.
  if (body?.error?.message) return body.error.message;
  if (!res.ok || !body?.url || new URL(body.url, location.origin).searchParams.get('error')) {
    return 'That e-mail address and password do not match an account.';
  }
  return null;
}
