"use client";

/**
 * Shown when a page fails while rendering. In production the error's message is withheld from the
 * browser (only a digest arrives), so the text covers the usual cause, a service that stopped
 * answering, without guessing. A database outage noticed before rendering gets proxy.ts's 503 page.
 */
export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="panel mx-auto mt-10 max-w-lg text-center" role="alert">
      <h1 className="text-xl font-semibold">This page could not be shown</h1>
      <p className="mt-2 text-ink-soft">
        Nothing is lost: uploaded logs stay in storage. Sortie or one of its services may be restarting; try again in a moment. If it keeps
        happening, tell your crew lead the time it happened.
        {error.digest && <span className="figures mt-2 block text-xs">Reference {error.digest}</span>}
      </p>
      <button type="button" className="btn-primary mt-5" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
