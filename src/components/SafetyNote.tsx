/**
 * The usual cautions, shown wherever the product gives firing advice. Short on purpose: it points to
 * the people whose word counts. The safety page shows the fuller version, by kind of firing.
 */
export function SafetyNote({ className = '', full = false }: { className?: string; full?: boolean }) {
  return (
    <aside
      className={`rounded-control border border-ember-300 bg-ember-100/60 px-4 py-3 text-xs leading-relaxed text-ember-700 ${className}`}
      aria-label="Safety"
    >
      <p className="font-semibold">Fire safely</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-4">
        <li>Never leave a firing unattended: someone checks the kiln through the climb and is there when it should shut off.</li>
        <li>
          Vent the kiln: firings give off carbon monoxide and sulfur and fluorine compounds. Keep the room aired and people and pets away
          from the fumes.
        </li>
        <li>
          Reduction firings make carbon monoxide on purpose: fire them only with working ventilation and a carbon monoxide alarm in the kiln
          room.
        </li>
        <li>Lustres, china paints and decal papers give off strong fumes as their media burn off: vent the kiln and leave the room.</li>
        <li>
          Raku is fired outdoors, away from buildings and anything that burns, with heat-proof gloves, a face shield, natural-fibre clothing
          with long sleeves and closed shoes; the reduction cans smoke and give off carbon monoxide.
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
      {full && <FullCautions />}
    </aside>
  )
}

function FullCautions() {
  return (
    <div className="mt-4 space-y-3">
      <section>
        <h2 className="font-semibold">Every firing</h2>
        <p>
          Check the kiln before you leave it and again at the hour it should shut off; a controller or a kiln sitter can fail. Keep the kiln
          on a non-combustible floor with the clearance its maker asks for on every side.
        </p>
      </section>
      <section>
        <h2 className="font-semibold">Gas and reduction kilns</h2>
        <p>
          A reduction atmosphere is incomplete combustion: the flue and the room carry carbon monoxide, which you cannot see or smell. Keep
          a carbon monoxide alarm in the room, the flue clear, and nobody sleeping above or beside a firing kiln.
        </p>
      </section>
      <section>
        <h2 className="font-semibold">Lustre, china paint and decals</h2>
        <p>
          Their oils and resins burn off below about 550 °C (1020 °F) with heavy fumes. Fire with the kiln vented or the lid propped as its
          maker allows, the room empty and aired. Metallic lustres are not for surfaces that touch food.
        </p>
      </section>
      <section>
        <h2 className="font-semibold">Raku</h2>
        <p>
          Ware comes out at glaze heat. Fire outdoors on bare ground, with a clear path from kiln to can, water and a fire extinguisher to
          hand, and everyone near in heat-proof gloves, a face shield and natural-fibre clothing. Raku ware is not food safe.
        </p>
      </section>
    </div>
  )
}
