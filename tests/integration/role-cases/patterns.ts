import type { RoleCases } from "./types";

export const patternsCases: RoleCases = {};
