/**
 * What app/ exposes, read from the source: every page, every route handler's exported HTTP
 * methods, and every export of every "use server" module. The matrix must name each one.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { HTTP_METHODS, type HttpMethod } from "./matrix";

export type AppSurface = {
  pages: Array<{ file: string; route: string }>;
  routes: Array<{ file: string; route: string; method: HttpMethod }>;
  actions: Array<{ file: string; name: string }>;
};

function walk(dir: string, root: string, out: string[] = []): string[] {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, root, out);
    else if (/\.(ts|tsx)$/.test(entry.name)) out.push(path.relative(root, full).split(path.sep).join("/"));
  }
  return out;
}

/** "app/(auth)/sign-in/check-email/page.tsx" → "/sign-in/check-email". Route groups do not count. */
export function routeOf(file: string): string {
  const segments = file.split("/").slice(1, -1).filter((s) => !/^\(.*\)$/.test(s));
  return `/${segments.join("/")}`;
}

/** Names of exported values (not types) of a module. */
export function exportedValues(source: ts.SourceFile): string[] {
  const names: string[] = [];
  const exported = (node: ts.Node) => ts.canHaveModifiers(node) && (ts.getModifiers(node) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
  for (const statement of source.statements) {
    if (ts.isFunctionDeclaration(statement) && exported(statement) && statement.name) names.push(statement.name.text);
    else if (ts.isClassDeclaration(statement) && exported(statement) && statement.name) names.push(statement.name.text);
    else if (ts.isVariableStatement(statement) && exported(statement)) {
      for (const d of statement.declarationList.declarations) if (ts.isIdentifier(d.name)) names.push(d.name.text);
    } else if (ts.isExportDeclaration(statement) && !statement.isTypeOnly && statement.exportClause && ts.isNamedExports(statement.exportClause)) {
      for (const element of statement.exportClause.elements) if (!element.isTypeOnly) names.push(element.name.text);
    } else if (ts.isExportAssignment(statement)) names.push("default");
  }
  return names;
}

function hasUseServer(source: ts.SourceFile): boolean {
  for (const statement of source.statements) {
    if (!ts.isExpressionStatement(statement) || !ts.isStringLiteral(statement.expression)) return false;
    if (statement.expression.text === "use server") return true;
  }
  return false;
}

export function readAppSurface(repoRoot: string): AppSurface {
  const surface: AppSurface = { pages: [], routes: [], actions: [] };
  for (const file of walk(path.join(repoRoot, "app"), repoRoot).sort()) {
    const text = readFileSync(path.join(repoRoot, file), "utf8");
    const source = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, file.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
    const base = path.posix.basename(file);
    if (base === "page.tsx" || base === "page.ts") surface.pages.push({ file, route: routeOf(file) });
    if (base === "route.ts" || base === "route.tsx") {
      for (const name of exportedValues(source)) {
        if ((HTTP_METHODS as readonly string[]).includes(name)) surface.routes.push({ file, route: routeOf(file), method: name as HttpMethod });
      }
    }
    if (hasUseServer(source)) for (const name of exportedValues(source)) surface.actions.push({ file, name });
  }
  return surface;
}

/** Whether a concrete path template fits a route pattern: literal segments equal, one value per [param], one or more per [...param]. */
export function pathFitsRoute(template: string, route: string): boolean {
  const pathname = template.split("?")[0]!;
  const have = pathname.split("/").filter(Boolean);
  const want = route.split("/").filter(Boolean);
  let i = 0;
  for (const [n, segment] of want.entries()) {
    if (/^\[\.\.\..+\]$/.test(segment)) return n === want.length - 1 && have.length > i;
    if (i >= have.length) return false;
    if (!/^\[.+\]$/.test(segment) && segment !== have[i]) return false;
    i += 1;
  }
  return i === have.length;
}
