// Debian's Chromium driven by playwright-core; screenshots go to a git-ignored folder for review.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";

export const SCREENSHOTS = path.resolve(import.meta.dirname, "../../test-results/screenshots");

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
  });
}

/** One browser for a test file, launched before its tests and closed after them; call at the file's top level. */
export function sharedBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error("The browser is not launched yet: use it inside a test or a hook.");
    return browser;
  };
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(SCREENSHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });
}

/** Signs in through the sign-in page and the identity-provider fake, as a person would. */
export async function signIn(page: Page, baseUrl: string, name: string) {
  await page.goto(`${baseUrl}/login`);
  await page.getByRole("link", { name: new RegExp(name) }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/auth/") && url.pathname !== "/login");
}
