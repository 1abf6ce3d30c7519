/**
 * The caution shown with every result. Holdline states model estimates; it never
 * declares food fit to eat. Pass `dryIce` when a dry-ice pack is part of the result.
 */
export function CautionBlock({ dryIce = false, extra = [] as string[] }: { dryIce?: boolean; extra?: string[] }) {
  return (
    <aside className="caution" aria-label="Cautions" data-testid="caution-block">
      <h2>Before you rely on this</h2>
      <ul>
        <li>These figures are model estimates under the assumptions listed with them. Real food, boxes and journeys differ.</li>
        <li>Check actual temperatures with a calibrated probe thermometer or a data logger.</li>
        <li>Your local food code and your regulator decide what is acceptable; the limits used here come from the rule set you chose, which you can edit.</li>
        {dryIce ? (
          <>
            <li>Dry ice gives off carbon dioxide gas: keep vehicles and rooms ventilated, never seal it airtight, and handle it with insulated gloves.</li>
            <li>When shipping, packages with dry ice are marked UN 1845 with the net mass of dry ice in kg, and carriers&apos; rules apply.</li>
          </>
        ) : null}
        {extra.map((e) => (
          <li key={e}>{e}</li>
        ))}
      </ul>
    </aside>
  );
}
