import { describe, it, expect } from "vitest";
import { renderToStaticMarkup } from "react-dom/server";
import { UnitInput } from "../../app/_components/UnitInput";
import { UnitsProvider } from "../../app/_components/units-context";

const draw = (value: number | null, temperatureUnit: "C" | "F" = "C", nullable = false) =>
  renderToStaticMarkup(
    <UnitsProvider prefs={{ temperatureUnit, massUnit: "kg", lengthUnit: "mm" }}>
      <UnitInput id="t" quantity="temperature" value={value} nullable={nullable} onChange={() => {}} describedBy="t-error" invalid />
    </UnitsProvider>,
  );

describe("a number box in the person's units", () => {
  it("an emptied box (NaN in the form) renders empty instead of re-rendering forever", () => {
    expect(() => draw(Number.NaN)).not.toThrow();
    expect(draw(Number.NaN)).toContain('value=""');
    expect(draw(null, "C", true)).toContain('value=""');
  });
  it("shows the SI value in °F with its unit, tied to its message", () => {
    // T_F = T_C × 9/5 + 32 (NIST SP 811, Appendix B): −18 °C = −0.4 °F.
    const html = draw(-18, "F");
    expect(html).toContain('value="-0.4"');
    expect(html).toContain("°F");
    expect(html).not.toContain("°C");
    expect(html).toContain('aria-describedby="t-error"');
    expect(html).toContain('aria-invalid="true"');
  });
});
