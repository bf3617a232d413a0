import { describe, expect, inject, it } from "vitest";
import pg from "pg";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { decodeQr } from "../setup/pdf-tools.js";

const baseUrl = inject("baseUrl");
const databaseUrl = inject("databaseUrl");
const browser = useBrowser();

describe("tomorrow's rack list on a phone, as the demo set costumer", () => {
  it("opens from Today, and a garment's QR code opens check-out, which moves it to On set", async () => {
    const db = new pg.Client({ connectionString: databaseUrl });
    await db.connect();
    const page = await browser().newPage({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.getByRole("link", { name: "Tomorrow's rack list" }).click();
    await page.getByRole("heading", { name: "Tomorrow's rack list" }).waitFor();
    await page
      .getByRole("img", { name: /^QR code: check out / })
      .first()
      .waitFor();
    await page.screenshot({ path: ".data/e2e-rack-list-phone.png", fullPage: true });

    // Read each code as another phone's camera would (a screenshot of the code, decoded by ZXing) and
    // take the first garment that is in stock now.
    const codes = page.locator("[data-qr-for]");
    let chosen: { tag: string; url: string } | null = null;
    for (let i = 0; i < (await codes.count()) && !chosen; i++) {
      const code = codes.nth(i);
      const tag = (await code.getAttribute("data-qr-for"))!;
      const status = await db.query<{ status: string }>("SELECT status FROM garments WHERE production_id = $1 AND tag_code = $2", [
        SALTMARSH_ID,
        tag,
      ]);
      if (status.rows[0]?.status !== "in_stock") continue;
      await code.scrollIntoViewIfNeeded();
      const url = await decodeQr(await code.screenshot());
      chosen = { tag, url };
    }
    expect(chosen, "an in-stock garment on tomorrow's rack list").not.toBeNull();
    const { tag, url } = chosen!;
    expect(url).toBe(`${baseUrl}/p/${SALTMARSH_ID}/wardrobe/scan?tag=${encodeURIComponent(tag)}&to=on_set`);

    await page.goto(url);
    await page.getByRole("heading", { name: "Check in / out" }).waitFor();
    expect(await page.getByLabel("Tag code").inputValue()).toBe(tag);
    expect(await page.getByRole("button", { name: "On set", exact: true }).getAttribute("aria-pressed")).toBe("true");
    await page.getByRole("button", { name: "Move to On set" }).click();
    await page
      .getByRole("list", { name: "Scanned garments" })
      .getByText(/→ On set/)
      .waitFor();
    await page.screenshot({ path: ".data/e2e-rack-list-checkout.png", fullPage: true });

    const after = await db.query<{ status: string; n: string }>(
      "SELECT g.status, (SELECT count(*) FROM garment_status_events e WHERE e.garment_id = g.id AND e.to_status = 'on_set') AS n FROM garments g WHERE g.production_id = $1 AND g.tag_code = $2",
      [SALTMARSH_ID, tag],
    );
    expect(after.rows[0]?.status).toBe("on_set");
    expect(Number(after.rows[0]?.n)).toBeGreaterThanOrEqual(1);
    await db.end();
    await page.close();
  });
});
