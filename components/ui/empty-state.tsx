import Link from "next/link";

export interface EmptyStateProps {
  title: string;
  children: React.ReactNode;
  action?: { href: string; label: string };
}

/** What to do next when a list has nothing in it yet. */
export function EmptyState({ title, children, action }: EmptyStateProps) {
  return (
    <div className="rounded-lg border border-dashed border-tide-300 bg-tide-50 px-6 py-10 text-center">
      <h2 className="text-lg font-semibold text-tide-900">{title}</h2>
      <div className="mx-auto mt-2 max-w-prose text-ink-soft">{children}</div>
      {action && (
        <Link href={action.href} className="btn-primary mt-5">
          {action.label}
        </Link>
      )}
    </div>
  );
}
