/**
 * One object per server process, however many times the module asking for it is evaluated.
 *
 * Next.js does not promise one instance of a module per process: `instrumentation.ts` (which starts the run
 * queue at boot) and the route handlers are compiled as separate server entries, so the same file imported
 * by both can be evaluated twice (vercel/next.js#69544, #65350), and the development server evaluates an
 * edited module again on every reload. What must exist once per process — the database handle (PGlite lets
 * one opener have a data folder), the run queue, the LISTEN hub, the worker threads — is therefore kept on
 * `globalThis` under a key and made on first use. Everything else stays plain module state.
 */
export function processSingleton<T extends object>(key: string, make: () => T): T {
  const slots = globalThis as typeof globalThis & { [name: symbol]: unknown };
  const slot = Symbol.for(`loamwork.${key}`);
  return (slots[slot] ??= make()) as T;
}
