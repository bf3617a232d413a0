/**
 * What `npm start` prints once the server listens. Demo accounts and their shared password are
 * listed only outside production: on a production server they would be an open door.
 */
export function startBanner(p: {
  url: string;
  seeded: boolean;
  production: boolean;
  /** Where the private PostgreSQL runs, when npm start manages one. */
  database?: string;
  mailTo: string;
  demoAccounts: ReadonlyArray<{ role: string; email: string; password: string }>;
}): string[] {
  const lines = [
    `\nSeamscene is running at ${p.url}${p.seeded ? " (demo data loaded)" : ""}`,
    ...(p.database ? [p.database] : []),
    `Mail goes to ${p.mailTo}`,
  ];
  if (!p.production && p.demoAccounts.length) {
    lines.push(`\nDemo accounts (password for all: ${p.demoAccounts[0]!.password}):`);
    for (const a of p.demoAccounts) lines.push(`  ${a.role.padEnd(13)} ${a.email}`);
  }
  lines.push("\nStop with Ctrl+C.");
  return lines;
}
