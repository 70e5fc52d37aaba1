// The routine-check programme in the browser: a plan from a risk assessment, weight suitability, the due list,
// the training gate, and the printable records in A4 and Letter.
import { mkdirSync } from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";
import { describe, expect, inject, it } from "vitest";
import { screenshot, sharedBrowser, SCREENSHOTS, signIn } from "../helpers/browser";

const baseUrl = inject("baseUrl");
const TAG = "AVP-AB-77";
const browser = sharedBrowser();

async function newPage(name: string): Promise<Page> {
  const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
  await signIn(page, baseUrl, name);
  return page;
}

describe("the check programme", () => {
  it("a metrologist creates a plan from the risk assessment, is told why a weight may not serve it, and fixes it", async () => {
    const page = await newPage("Milo Ferrante");
    await page.goto(`${baseUrl}/instruments/new`);
    await page.getByLabel("Asset tag").fill(TAG);
    await page.getByLabel("Kind").selectOption("analytical_balance");
    await page.locator('select[name="siteId"]').selectOption({ label: "AVP · Averly Park laboratory" });
    await page.getByLabel("Unit of Max, d, e").selectOption("g");
    await page.getByLabel("Max (capacity)").fill("220");
    await page.getByLabel("d (readability)").fill("0.0001");
    await page.getByLabel("e (verification interval)").fill("0.001");
    await page.getByLabel("Accuracy class").selectOption("I");
    await page.getByRole("button", { name: "Register instrument" }).click();
    await page.getByRole("heading", { level: 1, name: TAG }).waitFor();

    await page.getByRole("link", { name: "Check plans" }).click();
    await page.getByRole("link", { name: "New plan from a risk assessment" }).click();
    await page.getByLabel("A wrong result would affect").selectOption("patient_safety");
    await page.getByLabel("Smallest net weight weighed (g)").fill("0.5");
    await page.getByLabel("Process tolerance (%)").fill("0.1");
    const risk = page.getByRole("region", { name: "Risk assessment" });
    await expect(risk.textContent()).resolves.toContain("High risk");
    await page.getByRole("button", { name: /Use the suggested interval \(every day\)/ }).click();
    expect(await page.getByLabel("Check every (days)").inputValue()).toBe("1");
    await page.getByLabel("Tolerance basis").selectOption("absolute");
    await page.getByLabel("Tolerance T (g)").fill("0.0003");
    await page.getByRole("checkbox", { name: /^AVP-W-04 / }).check();
    await page.getByRole("button", { name: "Create plan" }).click();
    const refusal = page.getByRole("alert").filter({ hasText: "may not serve this plan" });
    await refusal.waitFor();
    // 100 g E2: mpe 0.16 mg (OIML R 111 Table 1) against T/3 = 0.1 mg.
    expect(await refusal.textContent()).toMatch(/AVP-W-04 may not serve this plan: The E2 class mpe \(0\.16 mg\) is more than one third of the tolerance \(0\.1 mg\)/);
    await screenshot(page, "programme-plan-unsuitable-weight");

    await page.getByRole("checkbox", { name: /^AVP-W-04 / }).uncheck();
    await page.getByRole("checkbox", { name: /^AVP-W-03 / }).check();
    await page.getByLabel("Why this interval (kept with the plan)").fill("Assay weighings for release; daily as suggested.");
    await page.getByRole("button", { name: "Create plan" }).click();
    await page.getByRole("status").filter({ hasText: "Plan saved" }).waitFor();
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toBe(`Sensitivity plan · ${TAG}`);
    const weights = await page.getByRole("region", { name: "Test weights" }).textContent();
    expect(weights).toContain("AVP-W-03");
    expect(weights).toContain("Yes");
    expect(await page.getByRole("region", { name: "Stored risk assessment" }).textContent()).toContain("Why every day: Assay weighings for release");
    await screenshot(page, "programme-plan-saved");
    await page.close();
  });

  it("a technician's due-today list shows the new plan, never checked", async () => {
    const page = await newPage("Tomas Varga-Lind");
    await page.goto(`${baseUrl}/checks-due`);
    const row = page.getByRole("row").filter({ hasText: TAG });
    await row.waitFor();
    expect(await row.textContent()).toMatch(/Record sensitivity.*Due today.*None yet/);
    await screenshot(page, "programme-due-today");
    await row.getByRole("link", { name: "Record sensitivity" }).click();
    const text = (await page.getByText(/^Conventional mass/).textContent()) ?? "";
    await page.getByLabel("Reading 1 (g)").fill(Number(/Conventional mass ([\d.]+) g/.exec(text)![1]).toFixed(4));
    await page.getByRole("button", { name: "Record check" }).click();
    await page.getByRole("status").filter({ hasText: "Check recorded" }).waitFor();
    await page.goto(`${baseUrl}/checks-due`);
    await page.getByRole("heading", { level: 1, name: "Checks due" }).waitFor();
    expect(await page.getByRole("row").filter({ hasText: TAG }).count()).toBe(0);
    await page.goto(`${baseUrl}/schedule`);
    await page.getByRole("heading", { name: /AVP · today/ }).waitFor();
    await screenshot(page, "programme-schedule");
    await page.close();
  });

  it("an expired training record shows on the training page and blocks that check", async () => {
    const milo = await newPage("Milo Ferrante");
    await milo.goto(`${baseUrl}/training`);
    expect(await milo.getByLabel("Expired or expiring at QNW").textContent()).toMatch(/Rhea Castellane · repeatability · expires .* Expired/);
    await screenshot(milo, "programme-training");
    await milo.close();

    const rhea = await newPage("Rhea Castellane");
    await rhea.goto(`${baseUrl}/checks-due`);
    await rhea.getByRole("link", { name: "Record repeatability" }).first().click();
    await expect(rhea.getByRole("alert").textContent()).resolves.toContain("no valid training record for the repeatability check procedure");
    expect(await rhea.getByRole("button", { name: "Record check" }).count()).toBe(0);
    await rhea.close();
  });

  it("the registers, the audit trail and the printable history render; the history prints on A4 and Letter", async () => {
    const page = await newPage("Milo Ferrante");
    await page.goto(`${baseUrl}/weights`);
    await screenshot(page, "programme-weights");
    await page.getByRole("link", { name: "AVP-W-04" }).click();
    await page.getByRole("heading", { name: "Suitability for the plans that use it" }).waitFor();
    await screenshot(page, "programme-weight-detail");
    await page.goto(`${baseUrl}/audit?entity=plan`);
    expect(await page.getByRole("table").textContent()).toContain("plan.create");
    await screenshot(page, "programme-audit");

    await page.goto(`${baseUrl}/instruments?q=AVP-AB-01`);
    await page.getByRole("link", { name: "AVP-AB-01", exact: true }).click();
    await page.getByRole("link", { name: "Print history" }).click();
    await page.getByRole("heading", { level: 1, name: /Instrument history · AVP-AB-01/ }).waitFor();
    await screenshot(page, "programme-print-history");
    mkdirSync(SCREENSHOTS, { recursive: true });
    await page.emulateMedia({ media: "print" });
    for (const format of ["A4", "Letter"] as const) {
      const pdf = await page.pdf({ format, path: path.join(SCREENSHOTS, `programme-history-${format}.pdf`) });
      expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    }
    expect(await page.getByRole("button", { name: "Print" }).isVisible()).toBe(false);

    await page.emulateMedia({ media: "screen" });
    await page.goto(`${baseUrl}/audit?entity=check`);
    await page.getByRole("link", { name: "open" }).first().click();
    await page.getByRole("heading", { level: 1, name: /^Check record \d+$/ }).waitFor();
    expect(await page.getByRole("main").textContent()).toContain("Within acceptance");
    await screenshot(page, "programme-print-check");
    await page.emulateMedia({ media: "print" });
    await page.pdf({ format: "A4", path: path.join(SCREENSHOTS, "programme-check-A4.pdf") });
    await page.close();
  });
});
