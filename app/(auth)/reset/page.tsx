import { ResetRequestForm } from '@/components/forms/reset-forms';

export const metadata = { title: 'Reset password' };

export default function ResetPage() {
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Reset your password</h1>
      <ResetRequestForm />
    </div>
  );
}
