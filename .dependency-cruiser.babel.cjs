// How dependency-cruiser reads TypeScript here. The project compiles with TypeScript 7 (the
// native compiler, no JavaScript API), which dependency-cruiser 17 cannot load, so it reads
// .ts/.tsx through @babel/core (already installed with Next) with this config: Babel's own
// parser understands TypeScript and JSX, and the plugin below turns each file into nothing but
// its imports, which dependency-cruiser's JavaScript reader then follows.
//
// Every import is kept, with one exception: a type-only import from a package (`import type
// { Knex } from "knex"`) is dropped, since it never reaches a bundle; a type-only import of a
// project file is kept, because a client file that takes a type from a data module is exactly
// what the "no-data-module-in-client-code" rule is for (view types belong in model.ts). The
// reachability rule runs on a second pass that drops every type-only import (see below).
const isLocal = (s) => s.startsWith(".") || s.startsWith("@/");
// DEPCRUISE_RUNTIME_ONLY=1 (the second pass of scripts/check-imports.mjs, for the "reachable"
// rule): every type-only import is dropped, so a chain of imports is one a bundle really loads.
const RUNTIME_ONLY = process.env.DEPCRUISE_RUNTIME_ONLY === "1";

function importsOnly({ types: t }) {
  return {
    name: "imports-only",
    manipulateOptions(opts, parserOpts) {
      const f = opts.filename ?? "";
      if (/\.(ts|tsx|mts|cts)$/.test(f)) parserOpts.plugins.push("typescript");
      if (/\.(tsx|jsx|js)$/.test(f)) parserOpts.plugins.push("jsx");
    },
    visitor: {
      Program: {
        exit(path) {
          const specs = [];
          const add = (src, typeOnly) => {
            if (typeof src !== "string") return;
            if (typeOnly && (RUNTIME_ONLY || !isLocal(src))) return;
            specs.push(src);
          };
          path.traverse({
            ImportDeclaration(p) {
              const n = p.node;
              const allTypes =
                n.importKind === "type" ||
                (n.specifiers.length > 0 && n.specifiers.every((s) => s.importKind === "type"));
              add(n.source.value, allTypes);
            },
            ExportNamedDeclaration(p) {
              if (p.node.source) add(p.node.source.value, p.node.exportKind === "type");
            },
            ExportAllDeclaration(p) {
              add(p.node.source.value, p.node.exportKind === "type");
            },
            CallExpression(p) {
              const { callee, arguments: args } = p.node;
              const first = args[0];
              if (!first || first.type !== "StringLiteral") return;
              const isImport = callee.type === "Import";
              const isRequire = callee.type === "Identifier" && callee.name === "require";
              const isViMock =
                callee.type === "MemberExpression" &&
                callee.object.type === "Identifier" &&
                callee.object.name === "vi" &&
                callee.property.type === "Identifier" &&
                ["mock", "doMock", "importActual", "importMock"].includes(callee.property.name);
              if (isImport || isRequire || isViMock) add(first.value, false);
            },
            TSImportType(p) {
              const a = p.node.argument;
              const v = a && (a.value ?? a.literal?.value);
              add(v, true);
            },
          });
          path.node.body = specs.map((s) => t.importDeclaration([], t.stringLiteral(s)));
          path.node.directives = [];
        },
      },
    },
  };
}

module.exports = {
  babelrc: false,
  configFile: false,
  sourceType: "module",
  plugins: [importsOnly],
};
