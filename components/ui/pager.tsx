import Link from "next/link";

/** Newer / older page links for a server-paged list; the URL carries the page, so it works without JS. */
export function Pager({ page, pages, hrefFor }: { page: number; pages: number; hrefFor: (page: number) => string }) {
  if (pages <= 1) return null;
  return (
    <nav aria-label="Pages" className="mt-4 flex items-center justify-between gap-2">
      {page > 1 ? (
        <Link href={hrefFor(page - 1)} className="btn-quiet" rel="prev">
          ← Newer page
        </Link>
      ) : (
        <span />
      )}
      <span className="figures text-sm text-ink-soft">
        {page} / {pages}
      </span>
      {page < pages ? (
        <Link href={hrefFor(page + 1)} className="btn-quiet" rel="next">
          Older page →
        </Link>
      ) : (
        <span />
      )}
    </nav>
  );
}
