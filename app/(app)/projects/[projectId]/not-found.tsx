import Link from 'next/link';
import { EmptyState } from '@/components/ui/panel';

/** A record id that names nothing in this project (or a project the caller is not in). */
export default function NotFound() {
  return (
    <EmptyState title="Not found">
      There is no such record in this project — the address may be mistyped, or it was deleted. Go
      back to{' '}
      <Link href="/projects" className="text-accent underline">
        your projects
      </Link>
      .
    </EmptyState>
  );
}
