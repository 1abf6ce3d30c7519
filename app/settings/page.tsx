import { currentUnits } from "@/app/_server/units";
import { SettingsForm } from "./SettingsForm";

export default async function SettingsPage() {
  return (
    <>
      <h1>Units</h1>
      <p className="muted">
        Holdline stores every value in SI units and converts only for display and entry. Other quantities keep fixed units (W/(m·K), kJ/kg, m/s).
      </p>
      <SettingsForm initial={await currentUnits()} />
    </>
  );
}
