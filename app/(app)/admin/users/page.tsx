import { notFound } from 'next/navigation';
import { AdminUsers } from '@/components/tables/admin-users';
import { PageHeader } from '@/components/ui/panel';
import { pageUser } from '@/lib/auth/page-user';

export const metadata = { title: 'Users' };

export default async function AdminUsersPage() {
  const user = await pageUser();
  if (user.siteRole !== 'admin') notFound();
  return (
    <main className="mx-auto w-full max-w-5xl px-6 py-8">
      <PageHeader
        title="Users"
        lead="Every account on this site. Admins manage accounts; project roles are set by project owners."
      />
      <AdminUsers myId={user.id} />
    </main>
  );
}
