import type { TestSpec } from "@/lib/spatial";

/**
 * What each test asks, in words a specialist can put in a report; cross tests say what inflates them.
 * `name` names a class by the code the engine knows it by; `pool` is the finds of all classes in scope.
 */
export function questionOf(t: TestSpec, name: (code: string) => string, pool: string): string {
  switch (t.type) {
    case "clark-evans":
      return "Are nearest neighbours closer (clustered) or farther apart (evenly spread) than for finds placed at random in the trench?";
    case "quadrat":
      return "Do counts per grid cell vary more (clustered) or less (evenly spread) than chance allows, each cell's share set by its area inside the trench?";
    case "l-envelope":
      return "Compared with finds placed at random anywhere in the trench (CSR), are there more neighbours within r (clustered) or fewer (evenly spread)?";
    case "pcf-envelope":
      return "At which distances are pairs of finds more (g > 1) or less (g < 1) common than under CSR?";
    case "cross-l":
      return t.null === "random-labelling"
        ? `Random labelling: the locations of the ${pool} finds stay put and their class labels are shuffled. It asks whether ${name(t.a)} and ${name(t.b)} are spread over those locations alike; when both lie in the same clusters it rightly finds nothing.`
        : `One class fixed: ${name(t.a)} stays where it is and ${name(t.b)} is replaced by random positions in the trench. It asks whether ${name(t.b)} finds lie nearer to ${name(t.a)} finds than chance positions would (attraction or avoidance); ${name(t.b)}'s own clustering inflates this test.`;
    case "k-difference":
      return `Under random labelling of the ${pool} finds, is ${name(t.a)} more (or less) clustered than ${name(t.b)} (segregation, Diggle & Chetwynd 1991)?`;
    case "inhomogeneous-l":
      return `Is ${name(t.class ?? "")} clustered beyond the general density of ${t.reference === undefined ? "all finds in scope" : name(t.reference)}?`;
  }
}
