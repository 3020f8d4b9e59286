'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';

export function ProjectSettingsForm({
  project,
  canEdit,
  children,
}: {
  project: { id: string; name: string; description: string };
  canEdit: boolean;
  /** Sections shown between the project's name and its removal. */
  children?: React.ReactNode;
}) {
  const router = useRouter();
  const [form, setForm] = useState({ name: project.name, description: project.description });
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  return (
    <div className="max-w-2xl space-y-6">
      <Panel title="Project">
        <form
          className="space-y-4"
          onSubmit={async (e) => {
            e.preventDefault();
            setError(null);
            try {
              await api(`/api/projects/${project.id}`, { method: 'PATCH', json: form });
              setSaved(true);
              router.refresh();
            } catch (err) {
              setError(err instanceof Error ? err.message : String(err));
            }
          }}
        >
          <TextField
            label="Name"
            name="name"
            disabled={!canEdit}
            value={form.name}
            onChange={(e) => setForm({ ...form, name: e.target.value })}
          />
          <TextField
            label="Description"
            name="description"
            disabled={!canEdit}
            value={form.description}
            onChange={(e) => setForm({ ...form, description: e.target.value })}
          />
          <ErrorNote>{error}</ErrorNote>
          {canEdit && <Button type="submit">Save</Button>}
          {saved && <span className="ml-3 text-sm text-ok">Saved.</span>}
        </form>
      </Panel>
      {children}
      {canEdit && (
        <Panel title="Delete the project">
          <p className="mb-3 text-sm text-ink-soft">
            Removes its catalogs, link runs, reviews and analyses for every member. This cannot be
            undone.
          </p>
          <Button
            variant="danger"
            onClick={async () => {
              if (!confirm(`Delete “${project.name}” and everything in it?`)) return;
              try {
                await api(`/api/projects/${project.id}`, { method: 'DELETE' });
                router.push('/projects');
              } catch (err) {
                setError(err instanceof Error ? err.message : String(err));
              }
            }}
          >
            Delete project
          </Button>
        </Panel>
      )}
    </div>
  );
}
