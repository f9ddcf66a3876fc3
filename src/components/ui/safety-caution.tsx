/** The standing caution shown in the app shell; procedures add their own hazard notes. */
export function SafetyCaution() {
  return (
    <p className="text-xs leading-relaxed text-graphite-soft">
      <strong className="text-graphite">Lethal voltages.</strong> Valve equipment holds hundreds of volts DC,
      and filter capacitors stay charged after switch-off. Work one hand, bring new or repaired units up on an
      isolation transformer or a current-limited supply, and discharge and verify with a meter before
      touching. Benchwright records that a qualified person approved a procedure; it does not make any
      procedure safe. Follow your local electrical codes and licensed practice.
    </p>
  );
}
