import { loadLibrary } from "@/app/_server/library";
import { SizePlanner } from "./SizePlanner";

export default async function SizePage() {
  const lib = await loadLibrary();
  return (
    <>
      <h1>Pack-out sizer</h1>
      <p className="lede">Which box, and how many of which packs, hold this load for the whole route plus a margin — at the lowest weight, cost or size?</p>
      {lib.shippers.length === 0 || lib.packs.length === 0 || lib.products.length === 0 || lib.routes.length === 0 ? <p>Add products, boxes, coolant packs and a route to the library first.</p> : <SizePlanner {...lib} />}
    </>
  );
}
