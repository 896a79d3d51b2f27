import type { RoleCases } from "./types";

export const planCases: RoleCases = {};
