import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl p-8">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p className="mt-2 text-ink-soft">That page does not exist, or it belongs to a site you are not on.</p>
      <Link className="btn mt-4" href="/sites">
        Back to your sites
      </Link>
    </main>
  );
}
