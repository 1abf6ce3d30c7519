/**
 * A side view of the box as packed: walls drawn to scale, packs placed under, over, beside or around
 * the load. Plain black and white so it prints well.
 */
export function LayerDiagram(props: {
  inner: { L: number; H: number };
  wall_m: number;
  lid_m: number;
  packs: { name: string; count: number; thickness_m: number; placement: "around" | "top" | "bottom" | "side" }[];
  productLabel: string;
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
  const packH = (p: (typeof props.packs)[number]) => Math.max(8, p.thickness_m * scale * Math.max(1, Math.ceil(p.count / 4)));
  for (const p of props.packs) {
    const h = packH(p);
    if (p.placement === "top" || p.placement === "around") {
      layers.push({ y: top, h, label: `${p.count} × ${p.name}${p.placement === "around" ? " (share on top)" : ""}` });
      top += h + 2;
    }
    if (p.placement === "bottom" || p.placement === "around") {
      bottom -= h;
      layers.push({ y: bottom, h, label: `${p.placement === "around" ? "rest of " : ""}${p.name} underneath` });
      bottom -= 2;
    }
    if (p.placement === "side") sides.push({ label: `${p.count} × ${p.name}` });
  }
  const sideW = sides.length ? Math.min(40, iw * 0.15) : 0;
  return (
    <svg viewBox={`0 0 ${W} ${ih + 2 * lid + 40}`} width="100%" style={{ maxWidth: 560 }} role="img" aria-label="Loading order, side view" data-testid="layer-diagram">
      <rect x={20} y={20} width={iw + 2 * w} height={ih + 2 * lid} fill="#ddd" stroke="#000" />
      <rect x={x0} y={y0} width={iw} height={ih} fill="#fff" stroke="#000" />
      <text x={22} y={14} fontSize={10}>
        lid {Math.round(props.lid_m * 1000)} mm · walls {Math.round(props.wall_m * 1000)} mm
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
          beside the load: {sides.map((s) => s.label).join("; ")}
        </text>
      ) : null}
    </svg>
  );
}
