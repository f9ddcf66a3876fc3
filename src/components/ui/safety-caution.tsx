import { SAFETY_CAUTION, type Caution } from '@shared/safety-caution';

/** The standing caution shown in the app shell (the run sheet passes its own); procedures add their own hazard notes. */
export function SafetyCaution({ caution = SAFETY_CAUTION }: { caution?: Caution }) {
  return (
    <p className="text-xs leading-relaxed text-graphite-soft">
      <strong className="text-graphite">{caution.lead}</strong> {caution.text}
    </p>
  );
}
