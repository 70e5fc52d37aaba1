import { describe, expect, inject, it } from "vitest";
import { DEMO_PEOPLE } from "../../db/seed/people";
import { screenshot, sharedBrowser, signIn } from "../helpers/browser";

const baseUrl = inject("baseUrl");
const browser = sharedBrowser();

const LANDING: Record<string, { path: string; heading: string }> = {
  admin: { path: "/admin", heading: "Admin" },
  metrologist: { path: "/instruments", heading: "Instruments" },
  site_manager: { path: "/fleet", heading: "Fleet" },
  technician: { path: "/checks-due", heading: "Checks due" },
  analyst: { path: "/instruments", heading: "Instruments" },
};

describe("signing in through the identity-provider fake", () => {
  it.each(DEMO_PEOPLE.map((p) => [p.name, p.role, p.email] as const))("%s (%s) lands on a page fitting the role", async (name, role) => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await signIn(page, baseUrl, name);
    expect(new URL(page.url()).pathname).toBe(LANDING[role].path);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe(LANDING[role].heading);
    expect(await page.getByRole("navigation", { name: "Main" }).textContent()).toContain(name);
    await screenshot(page, `landing-${role}-${name.split(" ")[0].toLowerCase()}`);
    await context.close();
  });

  it("signing out clears the session", async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    await signIn(page, baseUrl, "Milo Ferrante");
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/login\?signedOut=1/);
    await expect(page.getByRole("status").textContent()).resolves.toContain("You have signed out");
    await page.goto(`${baseUrl}/instruments`);
    expect(new URL(page.url()).pathname).toBe("/login");
    await context.close();
  });

  it("an unregistered person gets a clear page and no account", async () => {
    const context = await browser().newContext();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/auth/login?login_hint=${encodeURIComponent("stranger@elsewhere.test")}`);
    await page.waitForURL(/not-registered/);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Not registered here");
    expect(await page.textContent("main")).toContain("stranger@elsewhere.test");
    await page.goto(`${baseUrl}/instruments`);
    expect(new URL(page.url()).pathname).toBe("/login");
    await context.close();
  });
});

describe("roles in the browser", () => {
  it("a technician sees no edit button, and a direct POST to the edit action is refused with 403", async () => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await signIn(page, baseUrl, "Tomas Varga-Lind");
    await page.goto(`${baseUrl}/instruments`);
    await page.getByRole("link", { name: "AVP-AB-01" }).click();
    await page.getByRole("heading", { level: 1, name: "AVP-AB-01", exact: true }).waitFor();
    expect(await page.getByRole("link", { name: "Edit instrument" }).count()).toBe(0);
    expect(await page.getByRole("link", { name: "Register an instrument" }).count()).toBe(0);
    await screenshot(page, "instrument-detail-technician");
    const response = await page.request.post(`${page.url()}/edit`, { form: { assetTag: "AVP-AB-01", description: "changed by a technician" } });
    expect(response.status()).toBe(403);
    await context.close();
  });

  it("a metrologist edits an instrument; invalid input shows the field message and keeps the old value", async () => {
    const context = await browser().newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await signIn(page, baseUrl, "Milo Ferrante");
    await page.getByRole("link", { name: "AVP-AB-02" }).click();
    await page.getByRole("link", { name: "Edit instrument" }).click();
    await page.getByRole("heading", { level: 1, name: "Edit AVP-AB-02" }).waitFor();
    await page.getByLabel("d (readability)").fill("0.01");
    await page.getByRole("button", { name: "Save changes" }).click();
    await expect(page.getByText("d must not exceed e").first().textContent()).resolves.toContain("d must not exceed e");
    await screenshot(page, "instrument-edit-invalid");
    await page.getByLabel("d (readability)").fill("0.0001");
    await page.getByLabel("Description").fill("Analytical balance by the window");
    await page.getByRole("button", { name: "Save changes" }).click();
    await page.getByRole("heading", { level: 1, name: "AVP-AB-02", exact: true }).waitFor();
    expect(await page.textContent("main")).toContain("Analytical balance by the window");
    await context.close();
  });
});
