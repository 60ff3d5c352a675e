import { expect, test } from "@playwright/test";

// The files in public/: what a browser asks for on its own and what a crawler reads first.

test("robots.txt keeps crawlers out of the API and the shared permalinks", async ({ request }) => {
  const res = await request.get("/robots.txt");
  expect(res.status()).toBe(200);
  const lines = (await res.text()).split("\n").map((l) => l.trim());
  expect(lines).toContain("User-agent: *");
  expect(lines).toContain("Disallow: /api/");
  expect(lines).toContain("Disallow: /s/");
});

test("every page names its icon, and the icon is served", async ({ page, request }) => {
  const missing: string[] = [];
  page.on("response", (r) => {
    if (r.status() === 404) missing.push(r.url());
  });
  await page.goto("/");
  const href = await page.locator('link[rel="icon"]').first().getAttribute("href");
  expect(href).toBeTruthy();
  const icon = await request.get(href!);
  expect(icon.status()).toBe(200);
  expect(icon.headers()["content-type"]).toContain("image/svg+xml");
  await page.waitForLoadState("networkidle");
  expect(missing).toEqual([]);
});
