import fs from "node:fs";
import { createHash } from "node:crypto";
import { describe, expect, inject, it } from "vitest";
import unzipper from "unzipper";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();

describe("digital-double handoff", () => {
  it("the demo supervisor publishes a new packet version; the demo vfx user downloads and receives it", async () => {
    const sup = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(sup, baseUrl, "supervisor@seamscene.test");
    await sup.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await sup.goto(`${baseUrl}/p/${SALTMARSH_ID}/doubles?tab=packets`);
    await sup.getByRole("link", { name: "Version 1" }).waitFor();
    await sup.getByRole("button", { name: "New draft" }).click();
    await sup.getByRole("heading", { name: /draft packet/ }).waitFor();
    await sup.getByLabel(/Include the performer's measurements/).waitFor();
    await sup.getByRole("button", { name: "Publish version" }).click();
    await sup.getByRole("dialog").getByRole("button", { name: "Publish" }).click();
    await sup.getByRole("heading", { name: /version 2/ }).waitFor();
    // Publishing builds the packet's files in a worker; the status line says so until it is done.
    await expect.poll(() => sup.getByRole("status").textContent(), { timeout: 60_000 }).toContain("Published as version 2");
    expect(await sup.getByRole("table", { name: "Recipients" }).textContent()).toContain("vfx@seamscene.test");
    await sup.close();

    const vfx = await browser().newPage({ viewport: { width: 390, height: 844 }, acceptDownloads: true });
    await signIn(vfx, baseUrl, "vfx@seamscene.test");
    await vfx.getByRole("heading", { name: "Digital doubles" }).waitFor();
    await vfx.getByRole("link", { name: /version 2/ }).click();
    const [download] = await Promise.all([vfx.waitForEvent("download"), vfx.getByRole("link", { name: /Download version 2/ }).click()]);
    const file = await download.path();
    const zip = await unzipper.Open.buffer(fs.readFileSync(file));
    const files = new Map(await Promise.all(zip.files.map(async (f) => [f.path, await f.buffer()] as const)));
    // sha256sum -c: every listed file matches.
    const sums = files.get("SHA256SUMS")!.toString("utf8").trim().split("\n");
    for (const line of sums)
      expect(
        createHash("sha256")
          .update(files.get(line.slice(66))!)
          .digest("hex"),
      ).toBe(line.slice(0, 64));
    expect(JSON.parse(files.get("manifest.json")!.toString("utf8")).version).toBe(2);

    await vfx.getByRole("button", { name: "Mark received" }).click();
    await vfx.getByText(/You marked this version received/).waitFor();
    await vfx.screenshot({ path: ".data/e2e-doubles-vfx.png" });
    await vfx.close();
  });

  it("the demo cutter previews a DXF file of ASTM D6673 blocks, sees what was left out, and imports its pieces by keyboard", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/doubles?tab=panels`);
    await page.getByRole("tab", { name: /Hobnail boots/ }).click();
    await page.getByRole("button", { name: "Import DXF" }).click();

    // Written by ezdxf (tests/fixtures/doubles/make-dxf-fixtures.py).
    await page.getByLabel("DXF file").setInputFiles("tests/fixtures/doubles/ezdxf/astm-pieces.dxf");
    await page.getByRole("status").filter({ hasText: "2 pieces found · ASTM D6673 layers" }).waitFor();
    const skipped = await page.getByRole("table", { name: "Not used from the file" }).textContent();
    expect(skipped).toContain("turn points (layer 2)");
    expect(skipped).toContain("internal lines (layer 8)");
    await page.getByRole("button", { name: "Import 2 pieces" }).focus();
    await page.keyboard.press("Enter");

    await page.getByRole("heading", { name: /Panels of Hobnail boots/ }).waitFor();
    await page.getByRole("tab", { name: /Hobnail boots \(2\)/ }).waitFor();
    await page.screenshot({ path: ".data/e2e-doubles-dxf.png" });
    await page.close();
  });
});
