import { AccountSettings } from '@/components/forms/account-settings';
import { PageHeader } from '@/components/ui/panel';
import { pageUser } from '@/lib/auth/page-user';

export const metadata = { title: 'Account' };

export default async function AccountPage() {
  const user = await pageUser();
  return (
    <main className="mx-auto w-full max-w-4xl px-6 py-8">
      <PageHeader title="Account" lead={`${user.name} · ${user.email}`} />
      <AccountSettings notifyRunEmails={user.notifyRunEmails} />
    </main>
  );
}
