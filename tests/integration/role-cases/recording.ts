import type { RoleCases } from "./types";

export const recordingCases: RoleCases = {};
