import { pipeline } from "node:stream/promises";
import { Router, type Response } from "express";
import { logger } from "../lib/logger.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import {
  budgetCsvQuerySchema,
  continuityBookParamsSchema,
  continuityBookQuerySchema,
  continuityBooksRunInputSchema,
  rackListQuerySchema,
  reportRunParamsSchema,
  returnsCsvQuerySchema,
  type ReturnsSection,
} from "@shared/schemas/reports.js";
import {
  continuityBookCharacters,
  bookFileName,
  paperSizeOf,
  prepareContinuityBook,
  writeContinuityBook,
} from "../services/reports-continuity.service.js";
import {
  latestReportRun,
  openReportRunFile,
  getReportRun,
  presentReportRun,
  startContinuityBooksRun,
} from "../services/report-runs.service.js";
import { checkOutUrl, rackList } from "../services/reports-rack.service.js";
import { budgetReport, budgetSheets, returnsReport, returnsSheets } from "../services/reports-money.service.js";
import { renderRackListPdf } from "../lib/pdf/rack-list-pdf.js";
import { toCsv, writeXlsx, type Sheet } from "../lib/tabular.js";

/** /api/productions/:productionId/reports */
export const reportsRouter = Router({ mergeParams: true });

const pdfHeaders = (res: Response, fileName: string) => {
  res.setHeader("Content-Type", "application/pdf");
  res.setHeader("Content-Disposition", `inline; filename="${fileName}"`);
  res.setHeader("Cache-Control", "private, no-store");
};
const sendCsv = (res: Response, sheet: Sheet, fileName: string) => {
  res.setHeader("Content-Type", "text/csv; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="${fileName}"`);
  // A byte-order mark lets spreadsheet programs read the file as UTF-8.
  res.send("\uFEFF" + toCsv(sheet));
};
const sendXlsx = async (res: Response, sheets: Sheet[], fileName: string, title: string) => {
  res.setHeader("Content-Type", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
  res.setHeader("Content-Disposition", `attachment; filename="${fileName}"`);
  await streamed(res, () => writeXlsx(sheets, res, { title }));
};
/**
 * Runs a writer that streams into the response. Once bytes are on the wire an error can no longer
 * become a JSON error body: it is logged and the connection closed, so the download shows as failed.
 */
async function streamed(res: Response, write: () => Promise<unknown>): Promise<void> {
  try {
    await write();
  } catch (err) {
    if (!res.headersSent) throw err;
    logger.error({ err }, "report stream failed after it started");
    res.destroy();
  }
}

const sectionSheet: Record<ReturnsSection, string> = { rentals: "Rentals", lost: "Lost", out: "Out", wrap: "Wrap" };

// ---- Continuity books ----

reportsRouter.get("/continuity", authorize("report.continuity"), async (req, res) => {
  const actor = actorOf(req);
  const [characters, run] = await Promise.all([continuityBookCharacters(actor), latestReportRun(actor, "continuity_books")]);
  res.json({ data: { paperSize: paperSizeOf(req.production!), characters, latestRun: run ? presentReportRun(run) : null } });
});

reportsRouter.get("/continuity/:characterId.pdf", authorize("report.continuity"), async (req, res) => {
  const { characterId } = continuityBookParamsSchema.parse(req.params);
  const q = continuityBookQuerySchema.parse(req.query);
  const model = await prepareContinuityBook(actorOf(req), characterId, { changeId: q.changeId, photoSize: q.photos });
  pdfHeaders(res, bookFileName(model));
  await streamed(res, () => writeContinuityBook(model, res, q.photos));
});

reportsRouter.post("/continuity/books", authorize("report.continuity"), async (req, res) => {
  const input = continuityBooksRunInputSchema.parse(req.body ?? {});
  const run = await startContinuityBooksRun(actorOf(req), input);
  res.status(202).json({ data: presentReportRun(run) });
});

reportsRouter.get("/runs/:runId", authorize("report.continuity"), async (req, res) => {
  const { runId } = reportRunParamsSchema.parse(req.params);
  res.json({ data: presentReportRun(await getReportRun(actorOf(req), runId)) });
});

reportsRouter.get("/runs/:runId/file", authorize("report.continuity"), async (req, res) => {
  const { runId } = reportRunParamsSchema.parse(req.params);
  const { run, stream } = await openReportRunFile(actorOf(req), runId);
  res.setHeader("Content-Type", "application/zip");
  res.setHeader("Content-Disposition", `attachment; filename="continuity-books-${run.createdAt.toISOString().slice(0, 10)}.zip"`);
  if (run.bytes) res.setHeader("Content-Length", String(run.bytes));
  await streamed(res, () => pipeline(stream, res));
});

// ---- Tomorrow's rack list ----

reportsRouter.get("/rack-list", authorize("report.rack"), async (req, res) => {
  res.json({ data: await rackList(actorOf(req), rackListQuerySchema.parse(req.query)) });
});

reportsRouter.get("/rack-list.pdf", authorize("report.rack"), async (req, res) => {
  const list = await rackList(actorOf(req), rackListQuerySchema.parse(req.query));
  pdfHeaders(res, `rack-list-${list.day?.date ?? "none"}.pdf`);
  await streamed(res, () =>
    renderRackListPdf(list, res, { paperSize: paperSizeOf(req.production!), productionTitle: req.production!.title, qrUrl: checkOutUrl }),
  );
});

// ---- Returns and wrap ----

reportsRouter.get("/returns", authorize("report.returns"), async (req, res) => {
  res.json({ data: await returnsReport(actorOf(req)) });
});

reportsRouter.get("/returns.csv", authorize("report.returns"), async (req, res) => {
  const { section } = returnsCsvQuerySchema.parse(req.query);
  const sheet = returnsSheets(await returnsReport(actorOf(req))).find((s) => s.name === sectionSheet[section])!;
  sendCsv(res, sheet, `returns-${section}.csv`);
});

reportsRouter.get("/returns.xlsx", authorize("report.returns"), async (req, res) => {
  const r = await returnsReport(actorOf(req));
  await sendXlsx(res, returnsSheets(r), `returns-and-wrap-${r.today}.xlsx`, `${req.production!.title}: returns and wrap`);
});

// ---- Budget ----

reportsRouter.get("/budget", authorize("report.budget"), async (req, res) => {
  res.json({ data: await budgetReport(actorOf(req)) });
});

const budgetSheetNames = {
  garment: "Garments",
  category: "By category",
  character: "By character",
  change: "By change",
  source: "By source",
  week: "Rental per week",
} as const;

reportsRouter.get("/budget.csv", authorize("report.budget"), async (req, res) => {
  const { by } = budgetCsvQuerySchema.parse(req.query);
  const sheet = budgetSheets(await budgetReport(actorOf(req))).find((s) => s.name === budgetSheetNames[by])!;
  sendCsv(res, sheet, `budget-${by}.csv`);
});

reportsRouter.get("/budget.xlsx", authorize("report.budget"), async (req, res) => {
  const b = await budgetReport(actorOf(req));
  await sendXlsx(res, budgetSheets(b), "budget.xlsx", `${req.production!.title}: budget`);
});
