'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

export function CreateProjectForm() {
  const router = useRouter();
  const [name, setName] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        try {
          const { project } = await api<{ project: { id: string } }>('/api/projects', {
            method: 'POST',
            json: { name },
          });
          router.push(`/projects/${project.id}`);
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
        }
      }}
    >
      <div className="min-w-72 flex-1">
        <TextField
          label="New project"
          name="projectName"
          placeholder="e.g. Outer-arm CO survey"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
        />
      </div>
      <Button type="submit">Create project</Button>
      <div className="w-full">
        <ErrorNote>{error}</ErrorNote>
      </div>
    </form>
  );
}
