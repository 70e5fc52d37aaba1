import { rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { screenshot, sharedBrowser, signIn } from "../helpers/browser";

const baseUrl = inject("baseUrl");
const FIXTURES = path.resolve(import.meta.dirname, "../fixtures/imports");
const medium = path.join(os.tmpdir(), `tareline-e2e-import-${process.pid}.csv`);
const MEDIUM_ROWS = 40_000;
const browser = sharedBrowser();

beforeAll(async () => {
  // Sensitivity checks on three analytical balances, a minute apart over the autumn: enough rows to watch progress.
  const tags = ["AVP-AB-04", "AVP-AB-05", "AVP-AB-06"];
  // Seconds past the minute, so no row repeats a seeded check (those fall on whole minutes).
  const start = Date.parse("2026-09-01T06:00:37Z");
  const lines = Array.from({ length: MEDIUM_ROWS }, (_, i) => `${tags[i % 3]},sensitivity,${new Date(start + i * 60_000).toISOString()},g,AVP-W-05,200.000${i % 3},,`);
  await writeFile(medium, `asset_tag,check_type,performed_at,unit,weight,readings,operator_email,note\n${lines.join("\n")}\n`);
});
afterAll(async () => {
  await rm(medium, { force: true });
});

async function uploadAndMap(page: Page, file: string) {
  await page.goto(`${baseUrl}/imports`);
  await page.getByRole("heading", { level: 1, name: "Imports" }).waitFor();
  await page.locator('input[type="file"]').setInputFiles(file);
  await page.getByRole("button", { name: "Upload and preview" }).click();
  await page.getByRole("button", { name: "Check every row and import" }).waitFor();
}

describe("importing check history", () => {
  it("uploads, shows the preview with Tareline's columns mapped, checks every row with progress, and imports", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Milo Ferrante");
    await page.getByRole("link", { name: "Imports" }).click();
    await uploadAndMap(page, medium);
    expect(await page.getByLabel("Import column readings as").inputValue()).toBe("readings");
    expect(await page.getByLabel("Import column operator_email as").inputValue()).toBe("operator_email");
    expect(await page.getByRole("table").textContent()).toContain("AVP-AB-04");
    await screenshot(page, "import-mapping");
    await page.getByRole("button", { name: "Check every row and import" }).click();
    await page.getByRole("progressbar").first().waitFor();
    await screenshot(page, "import-progress");
    await page.getByRole("status").filter({ hasText: "checks imported" }).waitFor({ timeout: 120_000 });
    expect(await page.getByRole("status").textContent()).toContain(`${MEDIUM_ROWS.toLocaleString("en-GB")} checks imported`);
    expect(await page.getByRole("heading", { name: "Imported" }).count()).toBe(1);
    await screenshot(page, "import-done");
    await page.close();
  }, 180_000);

  it("rejects a file with bad rows as a whole, offers the report, then imports only the valid rows", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Milo Ferrante");
    await uploadAndMap(page, path.join(FIXTURES, "unknown-references.csv"));
    await page.getByRole("button", { name: "Check every row and import" }).click();
    await page.getByRole("heading", { name: "Not imported" }).waitFor();
    expect(await page.getByRole("alert").textContent()).toContain("Nothing was imported: 5 of 6 rows were rejected.");
    const download = page.waitForEvent("download");
    await page.getByRole("link", { name: /Download the report/ }).click();
    const report = await (await download).path();
    expect(report).toBeTruthy();
    await screenshot(page, "import-rejected");
    await page.getByRole("button", { name: "Import the 1 valid row and keep the report" }).click();
    await page.getByRole("status").filter({ hasText: "1 check imported" }).waitFor();
    await page.close();
  });

  it("a technician sees no Imports link and is refused the page", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Tomas Varga-Lind");
    expect(await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Imports" }).count()).toBe(0);
    const response = await page.goto(`${baseUrl}/imports`);
    expect(response?.status()).toBe(403);
    await page.close();
  });
});
