'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';

export function AcceptInvitation({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-3">
      <Button
        onClick={async () => {
          try {
            const { projectId } = await api<{ projectId: string }>(`/api/invitations/${token}`, {
              method: 'POST',
            });
            router.push(`/projects/${projectId}`);
          } catch (e) {
            setError(e instanceof Error ? e.message : String(e));
          }
        }}
      >
        Accept and open the project
      </Button>
      <ErrorNote>{error}</ErrorNote>
    </div>
  );
}
