import type { RoleCases } from "./types";

export const signOffCases: RoleCases = {};
