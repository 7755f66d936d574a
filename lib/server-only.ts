// The first import of every data.ts / data-*.ts and lib/db.ts: a module that talks to the
// database must never be bundled for the browser. The import check (npm run check:imports,
// .dependency-cruiser.cjs) refuses such an import before anything runs; this is the guard at
// run time, should one get through. (Not the "server-only" npm package: seeds, benchmarks and
// tests load data modules under tsx, vitest and Playwright, outside Next, where that package
// throws by design.)
if (typeof window !== "undefined") {
  throw new Error("A server-only module (database access) was loaded in the browser");
}

export {};
