import Link from 'next/link';
import { AcceptInvitation } from '@/components/forms/accept-invitation';
import { currentCaller } from '@/lib/auth/access';
import { HttpError } from '@/lib/http/errors';
import { describeInvitation } from '@/lib/services/members';

export const metadata = { title: 'Invitation' };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let invitation;
  try {
    invitation = await describeInvitation(token);
  } catch (e) {
    return (
      <div className="space-y-3">
        <h1 className="text-2xl font-semibold">Invitation</h1>
        <p className="text-sm">
          {e instanceof HttpError ? e.message : 'This invitation cannot be opened.'} Ask the project
          owner to invite you again.
        </p>
      </div>
    );
  }
  const caller = await currentCaller();
  const here = `/invite/${token}`;
  return (
    <div className="space-y-5">
      <h1 className="text-2xl font-semibold">Join “{invitation.projectName}”</h1>
      <p className="text-sm">
        This invitation is for <b>{invitation.email}</b>, as <b>{invitation.role}</b>.
      </p>
      {caller?.user.email === invitation.email ? (
        <AcceptInvitation token={token} />
      ) : caller ? (
        <p className="text-sm text-danger">
          You are signed in as {caller.user.email}. Sign out and sign in as {invitation.email} to
          accept.{' '}
          <Link className="underline" href="/api/auth/signout">
            Sign out
          </Link>
        </p>
      ) : (
        <div className="flex gap-3 text-sm">
          <Link
            className="rounded-md bg-accent px-3.5 py-2 font-medium text-white"
            href={`/signup?next=${encodeURIComponent(here)}&email=${encodeURIComponent(invitation.email)}`}
          >
            Create an account
          </Link>
          <Link
            className="rounded-md border border-rule px-3.5 py-2"
            href={`/signin?next=${encodeURIComponent(here)}&email=${encodeURIComponent(invitation.email)}`}
          >
            Sign in
          </Link>
        </div>
      )}
    </div>
  );
}
