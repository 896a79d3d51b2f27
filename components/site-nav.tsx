import Link from "next/link";
import type { Role } from "@/lib/server/reads/row-types";

/** The sections of one site; every member can read every section, writes depend on the role. */
export function siteSections(siteId: string) {
  const base = `/sites/${siteId}`;
  return [
    { href: base, label: "Overview" },
    { href: `${base}/finds`, label: "Finds register" },
    { href: `${base}/samples`, label: "Samples" },
    { href: `${base}/drawings`, label: "Drawings" },
    { href: `${base}/boxes`, label: "Boxes" },
    { href: `${base}/photos`, label: "Photos" },
    { href: `${base}/labels`, label: "Labels" },
    { href: `${base}/contexts`, label: "Context sheets" },
    { href: `${base}/levels`, label: "Level book" },
    { href: `${base}/patterns`, label: "Patterns" },
    { href: `${base}/sign-off`, label: "Sign-off" },
    { href: `${base}/members`, label: "People" },
    { href: `${base}/settings`, label: "Classes & grid" },
  ];
}

export function SiteNav({ siteId, role, current }: { siteId: string; role: Role; current: string }) {
  return (
    <nav
      aria-label="Site sections"
      className="no-print flex flex-wrap items-center gap-1 border-b border-paper-edge px-4 py-2"
    >
      {siteSections(siteId).map((s) => (
        <Link
          key={s.href}
          href={s.href}
          aria-current={s.href === current ? "page" : undefined}
          className={`inline-flex min-h-11 items-center rounded px-3 ${s.href === current ? "bg-ink text-paper" : "hover:bg-paper-deep"}`}
        >
          {s.label}
        </Link>
      ))}
      <span
        className="ml-auto rounded border border-ink/30 px-2 py-1 font-mono text-xs uppercase tracking-wider"
        title="Your role on this site"
      >
        {role}
      </span>
    </nav>
  );
}
