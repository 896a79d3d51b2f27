import { getDb } from "@/db/client";
import { artefactClasses, contexts, memberships, sites, trenches, users, type Role } from "@/db/schema";
import { hashPassword } from "@/lib/server/passwords";

let seq = 0;
const next = () => ++seq;

/** A 10 m × 6 m trench with a 2 m × 1 m baulk left standing in it. */
export const squareWithBaulk = {
  type: "Polygon" as const,
  coordinates: [
    [
      [0, 0],
      [10, 0],
      [10, 6],
      [0, 6],
      [0, 0],
    ] as [number, number][],
    [
      [4, 2],
      [4, 3],
      [6, 3],
      [6, 2],
      [4, 2],
    ] as [number, number][],
  ],
};

export async function makeUser(name = `Person ${next()}`) {
  const db = await getDb();
  // A fixed bcrypt-free hash: these users never sign in through the password check.
  const [u] = await db
    .insert(users)
    .values({ email: `${name.toLowerCase().replace(/\W+/g, ".")}.${next()}@test.invalid`, name, passwordHash: "x" })
    .returning();
  return u;
}

/** An account that signs in with this e-mail and password (hashed as sign-up hashes it); named after the address. */
export async function makeAccount(email: string, password: string, name = email.split("@")[0]!) {
  const db = await getDb();
  const [u] = await db
    .insert(users)
    .values({ email, name, passwordHash: await hashPassword(password) })
    .returning();
  return u!;
}

/** A site with one member per role, a stranger, a trench, a context and an artefact class. */
export async function makeSite() {
  const db = await getDb();
  const n = next();
  const [site] = await db
    .insert(sites)
    .values({ code: `T${n}`, name: `Test site ${n}` })
    .returning();
  const people: Record<Role | "stranger", Awaited<ReturnType<typeof makeUser>>> = {
    digger: await makeUser("Digger"),
    specialist: await makeUser("Specialist"),
    director: await makeUser("Director"),
    stranger: await makeUser("Stranger"),
  };
  for (const role of ["digger", "specialist", "director"] as const) {
    await db.insert(memberships).values({ siteId: site.id, userId: people[role].id, role });
  }
  const [trench] = await db
    .insert(trenches)
    .values({ siteId: site.id, code: "A", outline: squareWithBaulk })
    .returning();
  const [context] = await db
    .insert(contexts)
    .values({ siteId: site.id, trenchId: trench.id, number: 1000 + n, type: "layer" })
    .returning();
  const [cls] = await db
    .insert(artefactClasses)
    .values({ siteId: site.id, code: "FL", label: "Flint flake", colour: "#0072b2", symbol: "triangle" })
    .returning();
  return { site, people, trench, context, cls };
}

export type SiteFixture = Awaited<ReturnType<typeof makeSite>>;
