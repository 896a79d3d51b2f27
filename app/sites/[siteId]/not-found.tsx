import Link from "next/link";

export default function SiteNotFound() {
  return (
    <main className="mx-auto max-w-xl p-8">
      <h1 className="text-2xl font-bold">Not on this site</h1>
      <p className="mt-2 text-ink-soft">This record does not exist, or the site is not one of yours.</p>
      <Link className="btn mt-4" href="/sites">
        Your sites
      </Link>
    </main>
  );
}
