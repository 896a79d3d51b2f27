import { describe, expect, it } from "vitest";
import { findMatches } from "@/components/plan/finds-list";
import type { FindRow } from "@/components/plan/rows";

const find = (number: number, contextNumber: number, classCode: string, classLabel: string) =>
  ({ number, contextNumber, classCode, classLabel }) as FindRow;
const flake = find(231, 1004, "FLK", "Flint flake");
const bone = find(1004, 1002, "BBN", "Burnt bone");

describe("searching the plan's finds list", () => {
  it("finds by number, with or without #", () => {
    expect(findMatches(flake, "231")).toBe(true);
    expect(findMatches(flake, "#23")).toBe(true);
    expect(findMatches(flake, "#31")).toBe(false);
  });

  it("finds by context, and # keeps a number from meaning a context", () => {
    expect(findMatches(flake, "ctx 1004")).toBe(true);
    expect(findMatches(bone, "ctx 1004")).toBe(false);
    expect(findMatches(flake, "1004")).toBe(true);
    expect(findMatches(flake, "#1004")).toBe(false);
    expect(findMatches(bone, "#1004")).toBe(true);
  });

  it("finds by class code or label, every word having to match", () => {
    expect(findMatches(flake, "flk")).toBe(true);
    expect(findMatches(flake, "flint")).toBe(true);
    expect(findMatches(flake, "flint ctx 1004")).toBe(true);
    expect(findMatches(flake, "flint ctx 1002")).toBe(false);
    expect(findMatches(bone, "flint")).toBe(false);
  });
});
