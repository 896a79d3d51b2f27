import type { Metadata } from "next";
import Link from "next/link";
import { env } from "@/lib/env";
import { DEMO_USERS } from "@/lib/demo-users";
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
          <Link className="underline underline-offset-4" href="/reset-password">
            Forgotten your password?
          </Link>
        </p>
      </div>
      {env().LOAMWORK_DEMO === "1" && (
        <section className="sheet mt-4" aria-labelledby="demo-accounts">
          <h2 id="demo-accounts" className="font-bold">
            Demo accounts
          </h2>
          <p className="text-sm text-ink-soft">
            This server holds the invented demo site. Sign in as any of its people:
          </p>
          <table className="mt-2 w-full text-sm">
            <thead>
              <tr className="text-left">
                <th scope="col">Role</th>
                <th scope="col">E-mail</th>
                <th scope="col">Password</th>
              </tr>
            </thead>
            <tbody>
              {DEMO_USERS.map((u) => (
                <tr key={u.email}>
                  <td>{u.role}</td>
                  <td className="num">{u.email}</td>
                  <td className="num">{u.password}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      )}
    </main>
  );
}
