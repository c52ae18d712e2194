/**
 * The authorization matrix covers the whole app: a page, route method or server action without a
 * row fails here, and so does a row for something that no longer exists.
 */
import { fileURLToPath } from "node:url";
import ts from "typescript";
import { describe, expect, it } from "vitest";
import { pathFitsRoute, readAppSurface, exportedValues, routeOf } from "@/tests/authz/app-surface";
import { ACTION_ROWS, ACTORS, MATRIX, PAGE_ROWS, PLACEHOLDERS, ROUTE_ROWS, actionOutcomes, httpOutcomes, placeholdersIn, rowLabel } from "@/tests/authz/matrix";

const repoRoot = fileURLToPath(new URL("../..", import.meta.url));
const surface = readAppSurface(repoRoot);

describe("the app surface the matrix is checked against", () => {
  it("finds pages, route methods and server actions", () => {
    expect(surface.pages.length).toBeGreaterThan(20);
    expect(surface.routes.length).toBeGreaterThan(15);
    expect(surface.actions.length).toBeGreaterThan(15);
    expect(surface.pages).toContainEqual({ file: "app/(auth)/sign-in/page.tsx", route: "/sign-in" });
    expect(surface.routes).toContainEqual({ file: "app/api/auth/[...nextauth]/route.ts", route: "/api/auth/[...nextauth]", method: "POST" });
    expect(surface.actions).toContainEqual({ file: "app/shops/[shop]/jobs/actions.ts", name: "sendQuoteAction" });
  });

  it.each([
    ["export async function GET() {}", ["GET"]],
    ["export const POST = handler; export const dynamic = 'force-dynamic';", ["POST", "dynamic"]],
    ["async function h() {} export { h as GET, h as POST };", ["GET", "POST"]],
    ["export type X = number; export interface Y {} export { type Z } from './z';", []],
    ["export async function saveAction() {} export default async function other() {}", ["saveAction", "other"]],
  ])("reads the exported values of %s", (code, names) => {
    expect(exportedValues(ts.createSourceFile("x.ts", code, ts.ScriptTarget.Latest, true))).toEqual(names);
  });

  it.each([
    ["app/page.tsx", "/"],
    ["app/(auth)/sign-up/page.tsx", "/sign-up"],
    ["app/api/review/[kind]/[key]/comments/route.ts", "/api/review/[kind]/[key]/comments"],
  ])("names the route of %s", (file, route) => {
    expect(routeOf(file)).toBe(route);
  });

  it.each([
    ["/shops/{shop}/jobs/{jobId}", "/shops/[shop]/jobs/[jobId]", true],
    ["/shops/{shop}/jobs", "/shops/[shop]/jobs/[jobId]", false],
    ["/shops/{shop}/clients/new", "/shops/[shop]/clients/[clientId]", true],
    ["/api/auth/session", "/api/auth/[...nextauth]", true],
    ["/api/auth", "/api/auth/[...nextauth]", false],
    ["/api/uploadthing?actionType=upload", "/api/uploadthing", true],
    ["/", "/", true],
  ])("path %s fits route %s: %s", (path, route, fits) => {
    expect(pathFitsRoute(path, route)).toBe(fits);
  });
});

describe("authorization matrix coverage", () => {
  it("has a row for every page", () => {
    const named = new Set(PAGE_ROWS.map((r) => r.route));
    expect(surface.pages.filter((p) => !named.has(p.route)).map((p) => p.file)).toEqual([]);
  });

  it("has a row for every exported method of every route handler", () => {
    const named = new Set(ROUTE_ROWS.map((r) => `${r.method} ${r.route}`));
    expect(surface.routes.filter((r) => !named.has(`${r.method} ${r.route}`)).map((r) => `${r.method} ${r.file}`)).toEqual([]);
  });

  it("has a row for every export of every \"use server\" module", () => {
    const named = new Set(ACTION_ROWS.map((r) => `${r.file}#${r.name}`));
    expect(surface.actions.filter((a) => !named.has(`${a.file}#${a.name}`)).map((a) => `${a.file}#${a.name}`)).toEqual([]);
  });

  it("names only pages, route methods and actions that exist", () => {
    const pages = new Set(surface.pages.map((p) => p.route));
    const routes = new Set(surface.routes.map((r) => `${r.method} ${r.route}`));
    const actions = new Set(surface.actions.map((a) => `${a.file}#${a.name}`));
    const stale = MATRIX.filter((row) =>
      row.kind === "page" ? !pages.has(row.route) : row.kind === "route" ? !routes.has(`${row.method} ${row.route}`) : !actions.has(`${row.file}#${row.name}`),
    );
    expect(stale.map(rowLabel)).toEqual([]);
  });

  it("requests a path that fits each row's route", () => {
    const misfits = [...PAGE_ROWS, ...ROUTE_ROWS].filter((row) => !pathFitsRoute(row.path, row.route));
    expect(misfits.map(rowLabel)).toEqual([]);
  });

  it("uses only placeholders the fixtures fill", () => {
    const known = new Set(Object.keys(PLACEHOLDERS));
    const unknown = [...PAGE_ROWS, ...ROUTE_ROWS].flatMap((row) =>
      [row.path, row.kind === "route" ? row.body : null, row.kind === "route" ? row.headers : null, ...ACTORS.map((a) => row.expect[a])]
        .flatMap(placeholdersIn)
        .filter((name) => !known.has(name))
        .map((name) => `${rowLabel(row)}: {${name}}`),
    );
    expect(unknown).toEqual([]);
  });

  it("gives every row an outcome for every actor, and no two rows the same request", () => {
    for (const row of MATRIX) expect(Object.keys(row.expect).sort(), rowLabel(row)).toEqual([...ACTORS].sort());
    const keys = MATRIX.map((row) => (row.kind === "action" ? row.id : `${row.kind === "route" ? row.method : "GET"} ${row.path} ${row.kind === "route" ? (row.linkInBody ?? "") + JSON.stringify(row.body ?? null) : ""}`));
    expect(keys.filter((k, i) => keys.indexOf(k) !== i)).toEqual([]);
  });

  it("reads outcome lines strictly", () => {
    expect(httpOutcomes("200 403 SI →/portal 404 401 410")).toEqual({ owner: 200, designer: 403, production: "sign-in", client: { redirect: "/portal" }, link: 404, other: 401, anon: 410 });
    expect(actionOutcomes("ok ok 403 403 401 404 401").owner).toBe("ok");
    expect(() => httpOutcomes("200 200")).toThrow(/outcomes/);
    expect(() => httpOutcomes("200 200 200 200 200 200 302")).toThrow(/not an outcome/);
    expect(() => actionOutcomes("ok ok ok ok ok ok 200")).toThrow(/not an outcome/);
  });
});
