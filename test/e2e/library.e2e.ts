import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";

const suite = browserSuite();

async function fill(label: string | RegExp, value: string) {
  const box = suite.page.getByLabel(label, { exact: typeof label === "string" });
  await box.fill(value);
  await box.blur();
}

describe("template library in the browser", () => {
  it("shows the seeded demo scenario", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/products");
    await suite.page.getByRole("heading", { name: "Products" }).waitFor();
    const text = await suite.page.getByTestId("template-list").innerText();
    assert.match(text, /Whole turkey, 6 kg/);
    assert.match(text, /Cod fillets, frozen block/);
  });

  it("creates a product, showing field errors for a negative thickness and a bad composition until fixed", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/products/new");
    await fill("Name", "Braised beef cheeks, tray");
    await fill("Category", "Cooked meat");
    await suite.page.getByLabel("Shape").selectOption("slab");
    await fill("Thickness", "-30");
    await fill("Water", "0.5");
    await suite.page.getByRole("button", { name: /Add this product/ }).click();
    await suite.page.locator("#f-dimA_m-err").getByText(/must be greater than zero/).waitFor();
    await suite.page.getByText(/Mass fractions add up to 0\.800/).waitFor();
    // still on the form, nothing saved
    assert.match(suite.page.url(), /\/new$/);
    await fill("Thickness", "45");
    await fill("Water", "0.7");
    await suite.page.getByRole("button", { name: /Add this product/ }).click();
    await suite.page.waitForURL(/\/library\/products\?saved=/);
    await suite.page.getByTestId("template-list").getByText("Braised beef cheeks, tray").waitFor();
    await suite.page.reload();
    await suite.page.getByTestId("template-list").getByText("Braised beef cheeks, tray").waitFor();
    const res = await suite.page.request.get(suite.h.baseUrl + "/api/v1/products");
    const products = (await res.json()) as { name: string; dimA_m: number }[];
    const p = products.find((x) => x.name === "Braised beef cheeks, tray");
    assert.ok(p);
    assert.ok(Math.abs(p.dimA_m - 0.045) < 1e-12, `stored thickness in metres, got ${p.dimA_m}`);
  });

  it("edits a route's segments: add, reorder, remove, and the order is kept", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/routes");
    await suite.page.getByRole("link", { name: "Overnight courier, Millbrook depot", exact: true }).click();
    await suite.page.getByTestId("segment-0").waitFor();
    const before = await suite.page.locator("li.segment").count();
    await suite.page.getByRole("button", { name: "Add a segment" }).click();
    const n = before + 1;
    // the new segment is last: give it a label and move it to the top
    const last = suite.page.getByTestId(`segment-${n - 1}`);
    await last.getByLabel("What happens").fill("Chilled holding room");
    await last.getByLabel("Duration").fill("15");
    for (let i = n - 1; i > 0; i--) {
      await suite.page.getByRole("button", { name: `Move segment ${i + 1} earlier` }).click();
    }
    await suite.page.getByRole("button", { name: `Remove segment ${n}` }).click();
    await suite.page.getByRole("button", { name: /Save this route/ }).click();
    await suite.page.waitForURL(/\/library\/routes\?saved=/);
    const routes = (await (await suite.page.request.get(suite.h.baseUrl + "/api/v1/routes")).json()) as { name: string; segments: { label: string; duration_s: number }[] }[];
    const r = routes.find((x) => x.name === "Overnight courier, Millbrook depot")!;
    assert.equal(r.segments.length, before);
    assert.equal(r.segments[0].label, "Chilled holding room");
    assert.equal(r.segments[0].duration_s, 900);
    assert.equal(r.segments[1].label, "Collection and van");
  });

  it("edits a rule set's two-stage cooling: shows the stored values, names every missing one, and saves", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/rulesets");
    await suite.page.getByRole("link", { name: "Australia and New Zealand", exact: true }).click();
    await suite.page.getByLabel("Stage 1 within").waitFor();
    assert.equal(await suite.page.getByLabel("Stage 1 within").inputValue(), "2");
    assert.equal(await suite.page.getByLabel("Stage 2 time counted").inputValue(), "after_stage1");
    await fill("Stage 1 within", "");
    await suite.page.getByRole("button", { name: /Save this rule set/ }).click();
    await suite.page.locator("#f-coolStage1Max_s-err").getByText(/required when any cooling limit is given/).waitFor();
    await fill("Stage 1 within", "1.5");
    await suite.page.getByRole("button", { name: /Save this rule set/ }).click();
    await suite.page.waitForURL(/\/library\/rulesets\?saved=/);
    const rules = (await (await suite.page.request.get(suite.h.baseUrl + "/api/v1/rulesets")).json()) as { name: string; coolStage1Max_s: number }[];
    assert.equal(rules.find((r) => r.name === "Australia and New Zealand")!.coolStage1Max_s, 5400);
    await suite.page.goto(suite.h.baseUrl + "/library/products");
    await suite.page.getByRole("link", { name: "Roast chicken thighs, half tray", exact: true }).click();
    assert.equal(await suite.page.getByLabel(/Ready to eat/).isChecked(), true);
  });

  it("tells the second of two editors that the template changed, and keeps their edits", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/packs");
    await suite.page.getByRole("link", { name: "Gel pack, 600 g", exact: true }).click();
    await suite.page.waitForURL(/\/library\/packs\/\d+$/);
    await suite.page.getByLabel("Notes").waitFor();
    const editUrl = suite.page.url();
    const other = await suite.h.context.newPage();
    await other.goto(editUrl);
    await other.getByLabel("Notes").fill("Edited first by the other tab");
    await other.getByRole("button", { name: /Save this coolant pack/ }).click();
    await other.waitForURL(/saved=/);
    await other.close();
    await suite.page.getByLabel("Notes").fill("My slower edit");
    await suite.page.getByRole("button", { name: /Save this coolant pack/ }).click();
    const banner = suite.page.getByTestId("form-banner");
    await banner.getByText(/changed since you opened it/).waitFor();
    assert.equal(await suite.page.getByLabel("Notes").inputValue(), "My slower edit");
    await suite.page.getByRole("button", { name: "Save my version over theirs" }).click();
    await suite.page.waitForURL(/saved=/);
  });

  it("switches °C to °F and shows converted values", async () => {
    await suite.page.goto(suite.h.baseUrl + "/library/rulesets");
    assert.match(await suite.page.getByTestId("template-list").innerText(), /5 °C/);
    await suite.page.goto(suite.h.baseUrl + "/settings");
    await suite.page.getByLabel("Temperature").selectOption("F");
    await suite.page.getByRole("button", { name: "Use these units" }).click();
    await suite.page.getByText(/Saved\. Every page/).waitFor();
    await suite.page.goto(suite.h.baseUrl + "/library/rulesets");
    const text = await suite.page.getByTestId("template-list").innerText();
    assert.match(text, /41 °F/);
    assert.match(text, /-0\.4 °F/); // −18 °C
    await suite.page.getByRole("link", { name: "Canada", exact: true }).click();
    assert.equal(await suite.page.getByLabel("Chilled food, upper limit").inputValue(), "39.2");
    await suite.page.goto(suite.h.baseUrl + "/settings");
    await suite.page.getByLabel("Temperature").selectOption("C");
    await suite.page.getByRole("button", { name: "Use these units" }).click();
    await suite.page.getByText(/Saved\. Every page/).waitFor();
  });

  it("answers bad API input with 422 and field errors, and keeps serving", async () => {
    const bad = await suite.page.request.post(suite.h.baseUrl + "/api/v1/routes", { data: "{not json", headers: { "content-type": "application/json" } });
    assert.equal(bad.status(), 422);
    const range = await suite.page.request.post(suite.h.baseUrl + "/api/v1/routes", {
      data: { name: "Too hot", segments: [{ duration_s: 60, airTemp_C: -300, airSpeed_m_s: 0, sun_W_m2: 0 }] },
    });
    assert.equal(range.status(), 422);
    const body = (await range.json()) as { fieldErrors: Record<string, string[]> };
    assert.match(body.fieldErrors["segments.0.airTemp_C"][0], /absolute zero/);
    assert.equal((await suite.page.request.get(suite.h.baseUrl + "/api/v1/settings")).status(), 200);
  });
});
