"use client";

export default function SiteError({ reset }: { error: Error; reset: () => void }) {
  return (
    <main className="mx-auto max-w-xl p-8" role="alert">
      <h1 className="text-2xl font-bold">This site page failed to load</h1>
      <p className="mt-2 text-ink-soft">Nothing was changed. Try again; if it keeps failing, tell the site director.</p>
      <button className="btn mt-4" onClick={reset}>
        Try again
      </button>
    </main>
  );
}
