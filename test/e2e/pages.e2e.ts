/**
 * The app's own not-found page and icon: an unknown address and a missing template or plan answer 404 with
 * the not-found page and a link home (a loading page in the wrong segment would turn that 404 into a 200);
 * /favicon.ico is the icon.
 */
import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";

const suite = browserSuite();

describe("not-found page, loading page and icon", () => {
  it("an unknown address answers 404 with the not-found page and a link to the start page", async () => {
    const page = suite.page;
    const r = await page.goto(suite.h.baseUrl + "/no-such-page/here");
    assert.equal(r?.status(), 404);
    await page.getByTestId("not-found").getByRole("heading", { name: "No page here" }).waitFor();
    // The site header (from the root layout) stays, so the rest of the app is one click away.
    await page.getByRole("navigation", { name: "Main" }).waitFor();
    const home = page.getByTestId("home-link");
    assert.equal(await home.getAttribute("href"), "/");
    await home.click();
    await page.waitForURL(suite.h.baseUrl + "/");
    await page.getByRole("heading", { name: "Holdline", exact: true }).waitFor();
  });

  it("a template or plan that does not exist answers 404 too (the loading page does not start the response early)", async () => {
    for (const p of ["/plans/999999", "/library/products/999999", "/library/nothing"]) {
      const r = await suite.page.goto(suite.h.baseUrl + p);
      assert.equal(r?.status(), 404, p);
      await suite.page.getByTestId("not-found").waitFor();
    }
  });

  it("a planner opened from the not-found page shows without an error page", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/missing");
    await page.getByTestId("not-found").getByRole("link", { name: "hold planner" }).click();
    await page.waitForURL(/\/hold$/);
    await page.getByRole("heading", { level: 1 }).first().waitFor();
    assert.equal(await page.getByTestId("error-page").count(), 0);
    assert.equal(await page.getByTestId("not-found").count(), 0);
  });

  it("/favicon.ico is the app icon, not a 404", async () => {
    const r = await fetch(suite.h.baseUrl + "/favicon.ico");
    assert.equal(r.status, 200);
    assert.match(r.headers.get("content-type") ?? "", /image\/(x-icon|vnd\.microsoft\.icon)/);
    const bytes = new Uint8Array(await r.arrayBuffer());
    assert.deepEqual([...bytes.slice(0, 4)], [0, 0, 1, 0], "an ICO header");
    // The start page names it, besides the SVG icon.
    await suite.page.goto(suite.h.baseUrl + "/");
    assert.ok((await suite.page.locator('link[rel="icon"][href^="/favicon.ico"]').count()) >= 1);
  });
});
