// The "@/…" import alias of tsconfig.json, for dependency-cruiser's resolver (it cannot read
// tsconfig.json through TypeScript 7; see .dependency-cruiser.babel.cjs).
const path = require("node:path");

module.exports = { resolve: { alias: { "@": path.resolve(__dirname) } } };
