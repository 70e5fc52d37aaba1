// Time to first chart in headless Chromium: from navigation start to the first animation frame in which a chart's
// plotted marks are laid out, so the frame about to be painted shows data, not an empty frame or a loading line.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext } from "playwright-core";
import { median } from "./bench-measure";

const LAUNCH_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"];
const VIEWPORT = { width: 1440, height: 900 };

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: LAUNCH_ARGS });
}

type StorageState = Awaited<ReturnType<BrowserContext["storageState"]>>;

/**
 * Signs in through the app and the identity-provider fake with `login_hint`, as the sign-in page's demo links do.
 * Those links list the seeded demo people (from code, not the database), so the fleet's user is not among them; the
 * fake signs in any address it is given, and the app admits it only because the address is a registered user.
 */
export async function signIn(browser: Browser, baseUrl: string, email: string): Promise<StorageState> {
  const context = await browser.newContext({ viewport: VIEWPORT });
  try {
    const page = await context.newPage();
    await page.goto(`${baseUrl}/auth/login?login_hint=${encodeURIComponent(email)}`);
    await page.waitForURL((url) => !url.pathname.startsWith("/auth/"));
    // Home sends each person on to their own start page; the sign-in page or "not registered" means it failed.
    if (/^\/(login|not-registered)/.test(new URL(page.url()).pathname)) throw new Error(`Signing in as ${email} ended on ${page.url()}`);
    return await context.storageState();
  } finally {
    await context.close();
  }
}

/**
 * Installed before any of the page's own scripts: checks once per frame and keeps the frame's time. A string, not a
 * function: tsx keeps function names with a helper that does not exist in the page.
 */
const watchForChart = (selector: string) => `(() => {
  const frame = () => {
    const box = document.querySelector(${JSON.stringify(selector)})?.getBoundingClientRect();
    if (box && (box.width > 0 || box.height > 0)) window.__firstChartAt = performance.now();
    else requestAnimationFrame(frame);
  };
  requestAnimationFrame(frame);
})();`;

/** Milliseconds from navigation start, read in the page after the chart was drawn. */
export interface LoadTiming {
  chart: number;
  /** When the HTML document had arrived: separates the server's share from the browser's. */
  html: number;
  /** The last API request the page made before the chart (data loaded after hydration), if any. */
  fetchStart: number | null;
  fetchEnd: number | null;
}

const readTiming = (): LoadTiming => {
  const chart = (window as unknown as { __firstChartAt: number }).__firstChartAt;
  const fetches = (performance.getEntriesByType("resource") as PerformanceResourceTiming[]).filter((e) => e.initiatorType === "fetch" && new URL(e.name).pathname.startsWith("/api/") && e.responseEnd <= chart);
  const last = fetches.at(-1);
  return { chart, html: (performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming).responseEnd, fetchStart: last?.startTime ?? null, fetchEnd: last?.responseEnd ?? null };
};

function medianTiming(loads: LoadTiming[]): LoadTiming {
  const of = (pick: (l: LoadTiming) => number | null) => (loads.every((l) => pick(l) !== null) ? median(loads.map((l) => pick(l)!)) : null);
  return { chart: of((l) => l.chart)!, html: of((l) => l.html)!, fetchStart: of((l) => l.fetchStart), fetchEnd: of((l) => l.fetchEnd) };
}

/**
 * One cold load in a fresh context (empty HTTP cache, signed-in cookie only), then `warmRuns` loads in the same
 * context, each from a blank page (median of each figure); the screenshot scrolls the first mark into view so it
 * shows what was timed.
 */
export async function timeFirstChart(browser: Browser, state: StorageState, url: string, selector: string, options: { warmRuns: number; screenshot: string }) {
  const context = await browser.newContext({ viewport: VIEWPORT, storageState: state });
  try {
    await context.addInitScript(watchForChart(selector));
    const page = await context.newPage();
    const load = async () => {
      // From a blank page, so tearing down the previous copy of a large page is not counted in the next load.
      await page.goto("about:blank");
      await page.goto(url, { waitUntil: "commit", timeout: 180_000 });
      await page.waitForFunction(() => typeof (window as unknown as { __firstChartAt?: number }).__firstChartAt === "number", null, { timeout: 180_000 });
      if (new URL(page.url()).pathname !== new URL(url).pathname) throw new Error(`${url} ended on ${page.url()}`);
      return page.evaluate(readTiming);
    };
    const cold = await load();
    const warm: LoadTiming[] = [];
    for (let i = 0; i < options.warmRuns; i++) warm.push(await load());
    mkdirSync(path.dirname(options.screenshot), { recursive: true });
    await page.locator(selector).first().scrollIntoViewIfNeeded();
    await page.screenshot({ path: options.screenshot });
    return { cold, warm: medianTiming(warm), warmRuns: options.warmRuns };
  } finally {
    await context.close();
  }
}
