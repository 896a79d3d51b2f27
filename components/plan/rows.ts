import type { ClassRow as ClassAnswer, ContextRow as ContextAnswer, RegisterRow } from "@/lib/api/responses";

/** What the plan reads of a find, a class and a context: the API's own answers (lib/api/responses.ts). */
export type FindRow = Omit<RegisterRow, "trenchCode" | "classColour" | "classSymbol">;
export type ClassRow = Omit<ClassAnswer, "material">;
export type ContextRow = Pick<ContextAnswer, "id" | "number" | "type" | "state" | "signedOffAt"> & {
  extent?: ContextAnswer["extent"];
};
