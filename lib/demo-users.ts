/** The invented demo site's people, one per role (the seed creates them; a demo server's sign-in page lists them). */
export const DEMO_USERS = [
  { email: "digger@loamwork.test", name: "Nell Ashgrove", role: "digger", password: "trowel-digger-1" },
  { email: "specialist@loamwork.test", name: "Oskar Brandling", role: "specialist", password: "sieve-specialist-2" },
  { email: "director@loamwork.test", name: "Imogen Carrow", role: "director", password: "matrix-director-3" },
] as const;
