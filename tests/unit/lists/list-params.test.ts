import { describe, expect, it } from "vitest";
import { keptParams, listHref, parseListParams } from "@/lib/lists/list-params";

const options = { sorts: ["number", "planned", "status"] as const, defaultSort: "planned" as const, defaultDirection: "desc" as const };

describe("parseListParams", () => {
  it("reads page, sort and direction from the address", () => {
    expect(parseListParams({ page: "3", sort: "number", dir: "asc" }, options)).toEqual({ page: 3, sort: "number", direction: "asc" });
  });

  it("falls back to the list's default sort and direction when nothing is given", () => {
    expect(parseListParams({}, options)).toEqual({ page: 1, sort: "planned", direction: "desc" });
  });

  it("sorts an unknown column by the default column in its default direction", () => {
    expect(parseListParams({ sort: "password_hash", dir: "asc" }, options)).toEqual({ page: 1, sort: "planned", direction: "desc" });
  });

  it("keeps a known column but ignores a direction it does not know", () => {
    expect(parseListParams({ sort: "status", dir: "sideways" }, options)).toEqual({ page: 1, sort: "status", direction: "desc" });
  });

  it.each(["0", "-2", "1.5", "two", "", "1e9", "Infinity"])("treats page %j as page 1", (page) => {
    expect(parseListParams({ page }, options).page).toBe(1);
  });

  it("takes the first of a repeated parameter", () => {
    expect(parseListParams({ page: ["2", "5"], sort: ["number", "status"] }, options)).toMatchObject({ page: 2, sort: "number" });
  });

  it("uses ascending when the list names no default direction", () => {
    expect(parseListParams({ sort: "number" }, { sorts: ["number"], defaultSort: "number" }).direction).toBe("asc");
  });
});

describe("listHref", () => {
  it("keeps the filters and changes only what it is asked to", () => {
    const kept = keptParams({ status: "in progress", mine: "1", page: "4", empty: "", many: ["a", "b"] });
    expect(kept).toEqual({ status: "in progress", mine: "1", page: "4", many: "a" });
    const href = listHref("/runs", kept, { sort: "number", dir: "asc", page: undefined });
    const url = new URL(href, "http://lab.test");
    expect(url.pathname).toBe("/runs");
    expect(Object.fromEntries(url.searchParams)).toEqual({ status: "in progress", mine: "1", many: "a", sort: "number", dir: "asc" });
  });

  it("gives the bare path when nothing is left", () => {
    expect(listHref("/certificates", { page: "2" }, { page: undefined })).toBe("/certificates");
  });
});
