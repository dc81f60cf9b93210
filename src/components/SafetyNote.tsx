/**
 * The usual cautions, shown wherever the product gives firing advice. Short on purpose: it points to
 * the people whose word counts.
 */
export function SafetyNote({ className = '' }: { className?: string }) {
  return (
    <aside
      className={`rounded-control border border-ember-300 bg-ember-100/60 px-4 py-3 text-xs leading-relaxed text-ember-700 ${className}`}
      aria-label="Safety"
    >
      <p className="font-semibold">Fire safely</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-4">
        <li>
          Vent the kiln: firings give off carbon monoxide and sulfur and fluorine compounds. Keep the room aired and people and pets away
          from the fumes.
        </li>
        <li>Kiln cases, lids and peepholes are hot enough to burn; keep the area clear of anything that can catch fire.</li>
        <li>
          Look at cones and into the kiln only through IR/UV-rated glasses (shade 3 or darker welding-type lenses are common practice) once
          it glows.
        </li>
        <li>Glazes on ware for food and drink must be food-safe at the cone you fire; test for leaching when unsure.</li>
        <li>
          Electrical supply, gas lines and venting are matters for the kiln maker's instructions, local codes and licensed electricians and
          inspectors. Their word comes before anything here.
        </li>
      </ul>
    </aside>
  )
}
