"use client";

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const unavailable = /ECONNREFUSED|not answering|connect/i.test(error.message);
  return (
    <div className="panel mx-auto mt-10 max-w-lg text-center" role="alert">
      <h1 className="text-xl font-semibold">{unavailable ? "Sortie cannot reach its database right now" : "This page could not be shown"}</h1>
      <p className="mt-2 text-ink-soft">
        {unavailable ? "Nothing is lost. Try again in a moment." : "Try again; if it keeps happening, tell your crew lead the time it happened."}
        {error.digest && <span className="figures mt-2 block text-xs">Reference {error.digest}</span>}
      </p>
      <button type="button" className="btn-primary mt-5" onClick={reset}>
        Try again
      </button>
    </div>
  );
}
