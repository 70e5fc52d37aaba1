import { readFileSync } from "node:fs";
import type { Page } from "playwright-core";
import { describe, expect, inject, it } from "vitest";
import { screenshot, sharedBrowser, signIn } from "../helpers/browser";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

async function openInstrument(page: Page, tag: string, query = "") {
  await page.goto(`${baseUrl}/instruments?q=${tag}`);
  const href = await page.getByRole("link", { name: tag, exact: true }).getAttribute("href");
  await page.goto(`${baseUrl}${href}${query}`);
  await page.getByRole("heading", { level: 1, name: tag, exact: true }).waitFor();
}

describe("the metrologist's drift study", () => {
  it("shows the drifting balance's forecast and a run-rule marker whose tooltip names the rule", async () => {
    const page = await browser().newPage({ viewport: { width: 1400, height: 1000 } });
    await signIn(page, baseUrl, "Milo Ferrante");
    await openInstrument(page, "AVP-AB-01");
    const forecast = page.getByLabel("Forecast").first();
    await expect(forecast.textContent()).resolves.toMatch(/Forecast to tolerance\s*\d{2} \w{3,4} \d{4} \(in \d+ days\)/);
    const panel = page.getByRole("region", { name: "Sensitivity panel" });
    const marker = panel.locator("figure").first().locator("[role=img] svg path.fill-signal").last();
    await marker.scrollIntoViewIfNeeded();
    await marker.hover({ force: true });
    const tooltip = page.locator(".visx-tooltip").filter({ hasText: "By " });
    await tooltip.waitFor();
    await expect(tooltip.textContent()).resolves.toMatch(/in a row|beyond|CUSUM|EWMA|of three|of five/);
    await screenshot(page, "drift-study-AVP-AB-01");
    await page.close();
  });

  it("excludes a point with a reason and the stage's limits change", async () => {
    const page = await browser().newPage({ viewport: { width: 1400, height: 1000 } });
    await signIn(page, baseUrl, "Milo Ferrante");
    await openInstrument(page, "AVP-AB-05", "?range=all&ctype=sensitivity&csort=performedAt&cdir=asc");
    const panel = page.getByRole("region", { name: "Sensitivity panel" });
    await panel.getByText("Limits per stage").click();
    const stageRow = panel.locator('tr[data-stage="0"]');
    const before = await stageRow.textContent();
    // The oldest checks open stage 0's baseline; excluding the one farthest from zero must move its centre.
    const rows = page.getByRole("region", { name: "Checks" }).locator("tbody tr");
    const results = (await rows.locator("td:nth-child(3)").allTextContents()).map((t) => Math.abs(Number.parseFloat(t)));
    const target = rows.nth(results.indexOf(Math.max(...results)));
    const rings = panel.locator("figure").first().locator("[role=img] svg circle.stroke-excluded");
    const ringsBefore = await rings.count();
    await target.getByPlaceholder("Reason").fill("Draught shield left open during the reading");
    await target.getByRole("button", { name: "Exclude" }).click();
    await page.getByRole("status").filter({ hasText: "Check excluded" }).waitFor();
    await expect.poll(() => stageRow.textContent(), { timeout: 30_000 }).not.toBe(before);
    expect(await rings.count()).toBe(ringsBefore + 1);
    expect(await target.textContent()).toContain("Excluded");
    await page.close();
  });
});

describe("the site manager's fleet", () => {
  it("sorts by forecast date and the drifting balance comes first", async () => {
    const page = await browser().newPage({ viewport: { width: 1400, height: 1000 } });
    await signIn(page, baseUrl, "Sana Okonkwo-Hale");
    await page.goto(`${baseUrl}/fleet?sort=assetTag`);
    await page.waitForLoadState("networkidle");
    const header = page.getByRole("columnheader", { name: /Forecast to tolerance/ });
    await header.getByRole("link").click();
    await page.waitForURL(/sort=forecast/);
    await expect.poll(() => header.getAttribute("aria-sort"), { timeout: 30_000 }).toBe("ascending");
    const first = await page.locator("table tbody tr").nth(3).locator("td").first().textContent();
    const tags = await page.locator("table:has(caption) tbody tr td:first-child a").allTextContents();
    expect(tags.slice(0, 3)).toContain("AVP-AB-01");
    expect(first).toBeTruthy();
    await page.getByRole("heading", { name: /Worst outcome per week/ }).waitFor();
    await screenshot(page, "fleet-site-manager");
    await page.close();
  });
});

describe("the analyst's export", () => {
  it("downloads a filtered CSV with the expected rows, header and a neutralised formula cell", async () => {
    const tech = await browser().newPage({ viewport: { width: 1400, height: 1000 } });
    await signIn(tech, baseUrl, "Tomas Varga-Lind");
    await openInstrument(tech, "AVP-PB-02");
    await tech.getByRole("link", { name: "Record sensitivity check" }).click();
    const mass = Number(/Conventional mass ([\d.]+) g/.exec((await tech.getByText(/^Conventional mass/).textContent()) ?? "")![1]);
    await tech.getByLabel("Reading 1 (g)").fill(mass.toFixed(2));
    await tech.getByLabel("Note (optional)").fill("=SUM(A1:A9)");
    await tech.getByRole("button", { name: "Record check" }).click();
    await tech.getByRole("status").filter({ hasText: "Check recorded" }).waitFor();
    await tech.close();

    const page = await browser().newPage({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true });
    await signIn(page, baseUrl, "Anil Brookhart");
    await page.goto(`${baseUrl}/export`);
    await page.getByLabel("Instrument (asset tag)").fill("AVP-PB-02");
    await page.getByLabel("Check type").selectOption("sensitivity");
    await page.getByRole("button", { name: "Count matching checks" }).click();
    await page.waitForURL(/instrument=AVP-PB-02/);
    await page.waitForLoadState("networkidle");
    const status = page.getByRole("status").filter({ hasText: "checks match" });
    await status.waitFor();
    const count = Number(((await status.locator("strong").textContent()) ?? "").replace(/[^\d]/g, ""));
    await screenshot(page, "export-analyst");
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download CSV" }).click()]);
    expect(download.suggestedFilename()).toBe("checks_all-sites_AVP-PB-02_sensitivity.csv");
    const text = readFileSync((await download.path())!, "utf8");
    const lines = text.trim().split("\r\n");
    expect(lines[0]).toMatch(/^check_id,instrument,site,check_type,performed_at_utc,performed_at_site,site_time_zone,result_g,tolerance_g/);
    expect(lines).toHaveLength(count + 1);
    expect(lines.slice(1).every((l) => l.includes(",AVP-PB-02,AVP,sensitivity,"))).toBe(true);
    expect(text).toContain("'=SUM(A1:A9)");
    await page.close();
  });
});
