import type { SiteFixture } from "../../support/fixtures";

/** A mutating call ready to make: the route module, its path parameters and a valid body. */
export type Prepared = { mod: any; params: Record<string, string>; body?: unknown; query?: Record<string, string> };

/** For each mutating operation (by its catalogue name): a fresh target and a valid input. */
export type RoleCases = Record<string, (fx: SiteFixture) => Promise<Prepared>>;

let counter = 0;
export const nextCount = () => ++counter;
