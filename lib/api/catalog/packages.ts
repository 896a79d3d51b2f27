import { z } from "zod";
import { depositionQuery } from "@/lib/schemas/export";
import { directorOnly, wireDate, type ApiOperation } from "../operation";

/** A deposition package job: its progress, and once written its size and fingerprint. */
export const packageView = z.object({
  id: z.string(),
  /** The trench's code; null = the whole site. */
  trench: z.string().nullable(),
  status: z.enum(["queued", "running", "done", "failed"]),
  filesDone: z.number(),
  filesTotal: z.number(),
  fileName: z.string().nullable(),
  bytes: z.number().nullable(),
  /** SHA-256 of the package's manifest-sha256.txt, as bag-info.txt states it. */
  fingerprint: z.string().nullable(),
  /** False once the zip was removed to make room: only the newest few of the whole site and of each trench are kept. */
  fileKept: z.boolean(),
  error: z.string().nullable(),
  createdBy: z.string(),
  createdAt: wireDate,
  finishedAt: wireDate.nullable(),
});
export type PackageJob = z.output<typeof packageView>;

/** API operations of the deposition package written as a job (the streamed export stays in archive.ts). */
export const packagesApi = {
  packagesCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/packages",
    summary: "Start writing a deposition package (whole site, or a signed-off trench) as a job; poll it for progress",
    roles: directorOnly,
    doing: "export the deposition package",
    input: depositionQuery,
    response: packageView,
    successStatus: 201,
    idempotency: "claim",
  },
  packagesList: {
    method: "GET",
    path: "/api/sites/{siteId}/packages",
    summary: "The site's deposition packages, newest first, with progress and fingerprints",
    roles: directorOnly,
    doing: "export the deposition package",
    from: "none",
    response: z.array(packageView),
  },
  packageRead: {
    method: "GET",
    path: "/api/sites/{siteId}/packages/{packageId}",
    summary: "One deposition package job: status, files done of the total, size and fingerprint once written",
    roles: directorOnly,
    doing: "export the deposition package",
    from: "none",
    response: packageView,
  },
  packageFile: {
    method: "GET",
    path: "/api/sites/{siteId}/packages/{packageId}/file",
    summary: "The written package's zip, streamed from disk (Range requests answered with 206)",
    roles: directorOnly,
    doing: "export the deposition package",
    from: "none",
  },
} as const satisfies Record<string, ApiOperation>;
