'use client';

import { useMutation } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { z } from 'zod';
import { ApiError, api } from '@/lib/api-client';
import { dependentSchema, type Dependent } from '@/lib/schemas/catalogs';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

const refusalSchema = z.object({ analyses: z.array(dependentSchema) });

/**
 * Rename, note, archive or delete one run or analysis. `url` answers PATCH and DELETE; a delete
 * refused because analyses read the record lists them and, where `cascadeQuery` is given,
 * offers to delete them with it.
 */
export function RecordActions({
  what,
  url,
  name,
  note,
  archived,
  nameOptional = false,
  cascadeQuery,
  onChanged,
  onDeleted,
}: {
  what: string;
  url: string;
  name: string;
  note: string | null;
  archived: boolean;
  nameOptional?: boolean;
  cascadeQuery?: string;
  onChanged: () => void;
  onDeleted: () => void;
}) {
  const edit = useRef<HTMLDialogElement>(null);
  const del = useRef<HTMLDialogElement>(null);
  const [draftName, setDraftName] = useState(name);
  const [draftNote, setDraftNote] = useState(note ?? '');
  const [error, setError] = useState<string | null>(null);
  const [dependents, setDependents] = useState<Dependent[] | null>(null);

  const patch = useMutation({
    mutationFn: (body: Record<string, unknown>) => api(url, { method: 'PATCH', json: body }),
    onSuccess: () => {
      edit.current?.close();
      onChanged();
    },
    onError: (e) => setError(e.message),
  });
  const archive = useMutation({
    mutationFn: () => api(url, { method: 'PATCH', json: { archived: !archived } }),
    onSuccess: onChanged,
  });
  const remove = useMutation({
    mutationFn: (cascade: boolean) =>
      api(cascade && cascadeQuery ? `${url}?${cascadeQuery}` : url, { method: 'DELETE' }),
    onSuccess: () => {
      del.current?.close();
      onDeleted();
    },
    onError: (e) => {
      const refusal = e instanceof ApiError ? refusalSchema.safeParse(e.details) : null;
      if (refusal?.success) setDependents(refusal.data.analyses);
      setError(e.message);
    },
  });

  return (
    <>
      <Button
        variant="quiet"
        onClick={() => {
          setError(null);
          setDraftName(name);
          setDraftNote(note ?? '');
          edit.current?.showModal();
        }}
      >
        Rename / note
      </Button>
      <Button variant="quiet" disabled={archive.isPending} onClick={() => archive.mutate()}>
        {archived ? 'Restore' : 'Archive'}
      </Button>
      <Button
        variant="danger"
        onClick={() => {
          setError(null);
          setDependents(null);
          del.current?.showModal();
        }}
      >
        Delete
      </Button>
      {archive.error && <ErrorNote>{archive.error.message}</ErrorNote>}

      <dialog
        ref={edit}
        aria-label={`Rename this ${what}`}
        className="m-auto w-full max-w-md rounded-lg border border-rule bg-paper p-5 text-ink shadow-xl backdrop:bg-ink/30"
      >
        <form
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            setError(null);
            patch.mutate({
              name: draftName.trim() || (nameOptional ? null : draftName),
              note: draftNote.trim() || null,
            });
          }}
        >
          <TextField
            label="Name"
            value={draftName}
            maxLength={200}
            required={!nameOptional}
            hint={nameOptional ? 'Leave empty for the default name.' : 'Up to 200 characters.'}
            onChange={(e) => setDraftName(e.target.value)}
          />
          <label className="block space-y-1 text-sm">
            <span className="font-medium text-ink">Note</span>
            <textarea
              value={draftNote}
              maxLength={4000}
              rows={4}
              className="w-full rounded-md border border-rule bg-white px-3 py-2 text-sm"
              onChange={(e) => setDraftNote(e.target.value)}
            />
            <span className="block text-xs text-ink-soft">
              What this {what} is for; up to 4 000 characters.
            </span>
          </label>
          <ErrorNote>{error}</ErrorNote>
          <div className="flex justify-end gap-2">
            <Button type="button" variant="quiet" onClick={() => edit.current?.close()}>
              Close
            </Button>
            <Button type="submit" disabled={patch.isPending}>
              {patch.isPending ? 'Saving…' : 'Save'}
            </Button>
          </div>
        </form>
      </dialog>

      <dialog
        ref={del}
        aria-labelledby={`delete-${what}`}
        className="m-auto max-w-md rounded-lg border border-rule bg-paper p-5 text-ink shadow-xl backdrop:bg-ink/30"
      >
        <h2 id={`delete-${what}`} className="text-lg font-semibold">
          Delete “{name}”?
        </h2>
        {dependents?.length ? (
          <>
            <p className="mt-2 text-sm text-ink-soft">These analyses read this {what}:</p>
            <ul data-testid="record-dependents" className="mt-1 list-disc pl-5 text-sm">
              {dependents.map((d) => (
                <li key={d.id}>{d.name}</li>
              ))}
            </ul>
            <p className="mt-2 text-sm text-ink-soft">
              Delete them with it, or archive the {what} to hide it and keep everything.
            </p>
          </>
        ) : (
          <p className="mt-2 text-sm text-ink-soft">
            Everything it holds is removed for everyone in the project. This cannot be undone.
          </p>
        )}
        <div className="mt-3">
          <ErrorNote>{dependents?.length ? null : error}</ErrorNote>
        </div>
        <div className="mt-4 flex justify-end gap-2">
          <Button variant="quiet" onClick={() => del.current?.close()}>
            Keep it
          </Button>
          {dependents?.length && cascadeQuery ? (
            <Button
              variant="danger"
              disabled={remove.isPending}
              onClick={() => remove.mutate(true)}
            >
              {remove.isPending ? 'Deleting…' : `Delete with ${dependents.length} analyses`}
            </Button>
          ) : (
            <Button
              variant="danger"
              disabled={remove.isPending}
              onClick={() => remove.mutate(false)}
            >
              {remove.isPending ? 'Deleting…' : `Delete ${what}`}
            </Button>
          )}
        </div>
      </dialog>
    </>
  );
}
