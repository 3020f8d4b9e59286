import { notFound } from 'next/navigation';
import { EmptyState, PageHeader } from '@/components/ui/panel';
import { pageUser } from '@/lib/auth/page-user';
import { env } from '@/lib/env';
import { formatDateTime } from '@/lib/format/dates';
import { listCaughtMail } from '@/lib/services/mailbox';

export const metadata = { title: 'Sent mail' };

export default async function SentMailPage() {
  const user = await pageUser();
  if (user.siteRole !== 'admin' || env().LANEWISE_MODE !== 'local') notFound();
  const messages = await listCaughtMail();
  return (
    <main className="mx-auto w-full max-w-5xl px-6 py-8">
      <PageHeader
        title="Sent mail"
        lead="In local mode every message goes to the local mail catcher instead of the world. Newest first."
      />
      {messages.length === 0 ? (
        <EmptyState title="No mail sent yet">
          Invitations, password resets and run notices appear here.
        </EmptyState>
      ) : (
        <ul className="space-y-3">
          {messages.map((m) => (
            <li key={m.id} className="rounded-lg border border-rule bg-white/70 p-4 text-sm">
              <p className="font-medium">{m.subject}</p>
              <p className="text-xs text-ink-soft">
                to {m.to.join(', ')} · {formatDateTime(m.receivedAt)}
              </p>
              <pre className="mt-2 whitespace-pre-wrap font-mono text-xs">{m.text}</pre>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
