import type { Page } from "playwright-core";
import { describe, expect, inject, it } from "vitest";
import { screenshot, sharedBrowser, signIn } from "../helpers/browser";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

async function openInstrument(page: Page, tag: string) {
  await page.goto(`${baseUrl}/instruments?q=${tag}`);
  await page.getByRole("link", { name: tag, exact: true }).click();
  await page.getByRole("heading", { level: 1, name: tag, exact: true }).waitFor();
}

/** The suggested weight's conventional mass, rounded to the balance's 0.1 mg: a reading right on the weight. */
async function readingOnWeight(page: Page): Promise<string> {
  const text = (await page.getByText(/^Conventional mass/).textContent()) ?? "";
  return Number(/Conventional mass ([\d.]+) g/.exec(text)![1]).toFixed(4);
}

describe("a technician records checks", () => {
  it("records sensitivity, repeatability and eccentricity checks within acceptance, seeing the result as typed", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Tomas Varga-Lind");
    await openInstrument(page, "AVP-AB-03");

    await page.getByRole("link", { name: "Record sensitivity check" }).click();
    await page.getByRole("heading", { level: 1, name: /Sensitivity check/ }).waitFor();
    const onWeight = await readingOnWeight(page);
    await page.getByLabel("Reading 1 (g)").fill(onWeight);
    await expect(page.getByRole("region", { name: "Result as typed" }).textContent()).resolves.toContain("Within acceptance");
    await screenshot(page, "record-sensitivity");
    await page.getByRole("button", { name: "Record check" }).click();
    await page.getByRole("status").filter({ hasText: "Check recorded" }).waitFor();
    expect(await page.getByRole("status").textContent()).toContain("Within acceptance");

    await page.getByRole("link", { name: "Record repeatability check" }).click();
    await page.getByRole("heading", { level: 1, name: /Repeatability check/ }).waitFor();
    const readings = ["10.0001", "10.0002", "10.0001", "10.0000", "10.0001", "10.0002", "10.0001", "10.0001", "10.0000", "10.0001"];
    for (const [i, value] of readings.entries()) await page.getByLabel(`Reading ${i + 1} (g)`, { exact: true }).fill(value);
    await expect(page.getByRole("region", { name: "Result as typed" }).textContent()).resolves.toContain("Minimum weight");
    await page.getByRole("button", { name: "Record check" }).click();
    await page.getByRole("status").filter({ hasText: "Check recorded" }).waitFor();

    await page.getByRole("link", { name: "Record eccentricity check" }).click();
    await page.getByRole("heading", { level: 1, name: /Eccentricity check/ }).waitFor();
    const centre = await readingOnWeight(page);
    for (const label of ["Centre", "Front left", "Back left", "Back right", "Front right"]) await page.getByLabel(`${label} (g)`).fill(centre);
    await screenshot(page, "record-eccentricity");
    await page.getByRole("button", { name: "Record check" }).click();
    await page.getByRole("status").filter({ hasText: "Check recorded" }).waitFor();
    const table = await page.getByRole("region", { name: "Checks", exact: true }).textContent();
    expect(table).toContain("Sensitivity");
    expect(table).toContain("Repeatability");
    expect(table).toContain("Eccentricity");
    await page.close();
  });

  it("an out-of-tolerance check takes the instrument out of service and a message lands in the outbox", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Tomas Varga-Lind");
    await openInstrument(page, "AVP-AB-02");
    await page.getByRole("link", { name: "Record sensitivity check" }).click();
    await page.getByLabel("Reading 1 (g)").fill("200.5000");
    await expect(page.getByRole("region", { name: "Result as typed" }).textContent()).resolves.toContain("Out of tolerance");
    await page.getByRole("button", { name: "Record check" }).click();
    await page.getByRole("heading", { name: "Out of service: do not use this instrument" }).waitFor();
    expect(await page.getByRole("status").textContent()).toContain("Out of tolerance");
    expect(await page.getByRole("link", { name: "Record sensitivity check" }).count()).toBe(0);
    await screenshot(page, "out-of-service");
    await page.goto(`${baseUrl}/outbox`);
    expect(await page.textContent("main")).toContain("AVP-AB-02 is out of service");
    await page.close();
  });

  it("a technician whose training has expired is refused", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "Rhea Castellane");
    await openInstrument(page, "QNW-PB-01");
    await page.getByRole("link", { name: "Record repeatability check" }).click();
    await expect(page.getByRole("alert").textContent()).resolves.toContain("no valid training record for the repeatability check procedure");
    expect(await page.getByRole("button", { name: "Record check" }).count()).toBe(0);
    // Without the page, the action refuses too.
    const response = await page.request.post(page.url(), { form: { unit: "g", readings: "100.00" } });
    expect(response.status()).toBe(403);
    await page.close();
  });
});
