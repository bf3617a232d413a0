/** The API half of `npm run dev` (environment prepared by scripts/dev.ts). */
async function main() {
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  await migrate(sequelize);
  if (process.env.SMTP_HOST === "127.0.0.1") {
    const { startSmtpFake } = await import("../server/lib/smtp-fake.js");
    await startSmtpFake({ port: Number(process.env.SMTP_PORT) }).catch(() => undefined);
  }
  const { seedIfEmpty } = await import("../seeds/index.js");
  await seedIfEmpty();
  const { startServer } = await import("../server/index.js");
  await startServer();
  console.log("API on http://127.0.0.1:3000 — open the client at http://127.0.0.1:5173");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
