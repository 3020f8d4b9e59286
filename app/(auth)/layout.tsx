import Link from 'next/link';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6 py-12">
      <Link
        href="/"
        className="mb-8 flex items-center gap-2 text-lg font-semibold tracking-tight text-accent"
      >
        <span aria-hidden className="inline-block h-3 w-8 -skew-x-12 rounded-sm bg-accent" />
        Lanewise
      </Link>
      {children}
    </main>
  );
}
