import { describe, it, expect } from "vitest";
import { renderToStaticMarkup } from "react-dom/server";
import { LayerDiagram } from "../../app/_components/LayerDiagram";

describe("pack-out sheet diagram shows what the model placed", () => {
  const draw = (placement: "around" | "top" | "bottom" | "side", count: number) =>
    renderToStaticMarkup(<LayerDiagram inner={{ L: 0.4, H: 0.25 }} wall_m={0.04} lid_m={0.04} packs={[{ name: "Gel pack", count, thickness_m: 0.025, placement }]} productLabel="1 × Roast chicken" wallsLabel="lid 40 mm · walls 40 mm" />);
  it("three packs around: one on top, one underneath, one at the sides — never the whole count twice", () => {
    const svg = draw("around", 3);
    expect(svg).toContain("1 × Gel pack on top");
    expect(svg).toContain("1 × Gel pack underneath");
    expect(svg).toContain("at the sides: 1 × Gel pack");
    expect(svg).not.toMatch(/share on top|rest of/);
  });
  it("packs on top are drawn only on top", () => {
    const svg = draw("top", 3);
    expect(svg).toContain("3 × Gel pack on top");
    expect(svg).not.toContain("underneath");
  });
});
