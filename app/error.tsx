"use client";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  return (
    <main className="mx-auto max-w-xl p-8" role="alert">
      <h1 className="text-2xl font-bold">Something went wrong</h1>
      <p className="mt-2 text-ink-soft">The page could not be shown. Nothing you entered was changed.</p>
      <button className="btn mt-4" onClick={reset}>
        Try again
      </button>
    </main>
  );
}
