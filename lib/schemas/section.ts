import { z } from "zod";
import { metres, numeric } from "./common";

/**
 * A section of finds drawn on a trench plan: its line (site-grid metres), the band either side of it and the
 * vertical exaggeration of the figure. Saved sections are not edited: a changed section is saved anew.
 */
export const sectionCreateSchema = z
  .object({
    name: z
      .string()
      .trim()
      .min(1, "Name the section, e.g. S1 or east–west through 1005.")
      .max(80, "A section's name is at most 80 characters."),
    startX: metres,
    startY: metres,
    endX: metres,
    endY: metres,
    halfWidth: numeric(
      z
        .number({ error: "Give the band's half-width in metres." })
        .gt(0, "The band either side of the line must be wider than 0 m.")
        .max(50, "A band over 50 m either side is not a section."),
    ),
    exaggeration: numeric(
      z
        .number({ error: "Give the vertical exaggeration, e.g. 1, 2 or 5." })
        .min(0.1, "The vertical exaggeration is at least 0.1.")
        .max(100, "The vertical exaggeration is at most 100."),
    ),
  })
  .strict()
  .refine((s) => Math.hypot(s.endX - s.startX, s.endY - s.startY) >= 0.001, {
    message: "The section line must be at least a millimetre long: its start and end are the same point.",
    path: ["endX"],
  });

export const sectionExportQuery = z.object({
  format: z.enum(["svg", "png", "csv"], { error: "Export a section as svg, png or csv." }).default("svg"),
});

export type SectionCreate = z.infer<typeof sectionCreateSchema>;
