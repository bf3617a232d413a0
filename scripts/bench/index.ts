/**
 * `npm run bench`: every benchmark, one after another; each prints its figures and ratios.
 * `npm run bench -- sign-in` runs only those whose name contains one of the words given.
 */
export {};
const benches: Array<{ name: string; load: () => Promise<{ run: () => unknown | Promise<unknown> }> }> = [
  { name: "workroom planner", load: async () => ({ run: (await import("./workroom.js")).runWorkroomBench }) },
  { name: "snag engine", load: async () => ({ run: (await import("./snags.js")).runSnagBench }) },
  { name: "nesting (yardage marker)", load: async () => ({ run: (await import("./nesting.js")).runNestingBench }) },
  { name: "breakdown (CSV import, photo upload)", load: async () => ({ run: (await import("./breakdown.js")).runBreakdownBench }) },
  { name: "handoff packet ZIP", load: async () => ({ run: (await import("./packets.js")).runPacketBench }) },
  { name: "reports (continuity book PDF)", load: async () => ({ run: (await import("./reports.js")).runReportsBench }) },
  { name: "offline app shell (precache, initial JS)", load: async () => ({ run: (await import("./offline.js")).runOfflineBench }) },
  { name: "heavy uploads vs /api/health (worker pool)", load: async () => ({ run: (await import("./uploads.js")).runUploadsBench }) },
  { name: "sign-in and password reset (server process)", load: async () => ({ run: (await import("./auth.js")).runAuthBench }) },
];

const only = process.argv.slice(2).map((w) => w.toLowerCase());
for (const b of benches.filter((x) => !only.length || only.some((w) => x.name.toLowerCase().includes(w)))) {
  console.log(`\n=== ${b.name} ===`);
  const { run } = await b.load();
  await run();
}
