import { placementSplit } from "@/lib/physics/placement";
import type { Placement } from "@/lib/schemas/hold";

/**
 * A side view of the box as modelled: walls drawn to scale, each pack line's packs underneath, on top
 * or at the sides of the load exactly as the hold model places them (placementSplit: "around" shares
 * them out), so the sheet never shows a layer the model did not have. Plain black and white so it prints well.
 */
export function LayerDiagram(props: {
  inner: { L: number; H: number };
  wall_m: number;
  lid_m: number;
  packs: { name: string; count: number; thickness_m: number; placement: Placement; touchesLoad?: boolean }[];
  productLabel: string;
  /** The wall and lid thicknesses in the reader's units: "lid 40 mm · walls 40 mm". */
  wallsLabel: string;
}) {
  const W = 420;
  const scale = (W - 40) / (props.inner.L + 2 * props.wall_m);
  const iw = props.inner.L * scale;
  const ih = props.inner.H * scale;
  const w = Math.max(3, props.wall_m * scale);
  const lid = Math.max(3, props.lid_m * scale);
  const x0 = 20 + w;
  const y0 = 20 + lid;
  const layers: { y: number; h: number; label: string }[] = [];
  const sides: { label: string }[] = [];
  let top = y0;
  let bottom = y0 + ih;
  const packH = (thickness_m: number, n: number) => Math.max(8, thickness_m * scale * Math.max(1, Math.ceil(n / 4)));
  const apart = (p: (typeof props.packs)[number]) => (p.touchesLoad === false ? ", kept apart from the load" : "");
  for (const p of props.packs) {
    const split = placementSplit(p.placement, p.count);
    if (split.top > 0) {
      const h = packH(p.thickness_m, split.top);
      layers.push({ y: top, h, label: `${split.top} × ${p.name} on top${apart(p)}` });
      top += h + 2;
    }
    if (split.bottom > 0) {
      const h = packH(p.thickness_m, split.bottom);
      bottom -= h;
      layers.push({ y: bottom, h, label: `${split.bottom} × ${p.name} underneath${apart(p)}` });
      bottom -= 2;
    }
    if (split.side > 0) sides.push({ label: `${split.side} × ${p.name}${apart(p)}` });
  }
  const sideW = sides.length ? Math.min(40, iw * 0.15) : 0;
  return (
    <svg viewBox={`0 0 ${W} ${ih + 2 * lid + 40}`} width="100%" style={{ maxWidth: 560 }} role="img" aria-label="Loading order, side view" data-testid="layer-diagram">
      <rect x={20} y={20} width={iw + 2 * w} height={ih + 2 * lid} fill="#ddd" stroke="#000" />
      <rect x={x0} y={y0} width={iw} height={ih} fill="#fff" stroke="#000" />
      <text x={22} y={14} fontSize={10}>
        {props.wallsLabel}
      </text>
      {layers.map((l, i) => (
        <g key={i}>
          <rect x={x0 + 2 + sideW} y={l.y + 1} width={iw - 4 - 2 * sideW} height={l.h - 2} fill="#fff" stroke="#000" strokeDasharray="4 2" />
          <text x={x0 + 8 + sideW} y={l.y + l.h / 2 + 4} fontSize={10}>
            {l.label}
          </text>
        </g>
      ))}
      {sides.map((s, i) => (
        <g key={`s${i}`}>
          <rect x={i % 2 ? x0 + iw - sideW - 2 : x0 + 2} y={top + 2} width={sideW} height={Math.max(10, bottom - top - 4)} fill="#fff" stroke="#000" strokeDasharray="4 2" />
        </g>
      ))}
      <rect x={x0 + 6 + sideW} y={top + 4} width={iw - 12 - 2 * sideW} height={Math.max(12, bottom - top - 8)} fill="#f2f2f2" stroke="#000" />
      <text x={x0 + 12 + sideW} y={(top + bottom) / 2 + 4} fontSize={11}>
        {props.productLabel}
      </text>
      {sides.length ? (
        <text x={x0 + 2} y={ih + 2 * lid + 34} fontSize={10}>
          at the sides: {sides.map((s) => s.label).join("; ")}
        </text>
      ) : null}
    </svg>
  );
}
