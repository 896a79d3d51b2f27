import type { Metadata } from "next";
import Link from "next/link";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  return (
    <main className="mx-auto mt-16 max-w-md px-4">
      <div className="sheet">
        <p className="font-mono text-xs uppercase tracking-widest text-ink-faint">Loamwork</p>
        <h1 className="mt-1 text-3xl font-bold">Sign in to the site record</h1>
        <p className="mt-2 text-ink-soft">Finds, contexts and plans of the sites you work on.</p>
        <SignInForm next={next} />
        <p className="mt-4 text-sm">
          <Link className="underline underline-offset-4" href="/reset-password">Forgotten your password?</Link>
        </p>
      </div>
    </main>
  );
}
