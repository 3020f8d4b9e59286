import { ResetConfirmForm } from '@/components/forms/reset-forms';

export const metadata = { title: 'Choose a new password' };

export default async function ResetTokenPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Choose a new password</h1>
      <ResetConfirmForm token={token} />
    </div>
  );
}
