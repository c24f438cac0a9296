/** One page for unknown, expired and withdrawn links alike: it says nothing about the run. */
export default function ShareGone() {
  return (
    <section className="mx-auto max-w-md py-16 text-center" data-testid="share-gone">
      <h1 className="text-2xl font-bold">This link has expired or was withdrawn</h1>
      <p className="mt-2 text-ink-soft">Ask the person who sent it for a new one.</p>
    </section>
  );
}
