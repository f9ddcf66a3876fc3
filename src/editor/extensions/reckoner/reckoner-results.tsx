import type { BlockSnapshot, ResolvedReading } from '@shared/document/evaluate';
import { Figure } from '@/components/ui/figure';
import { inputLabel } from '@shared/document/block-view';
import { getReckoner, type FieldError } from '@shared/reckoners';
import { withLabel } from '@shared/schemas/problems';
import { LazyReckonerPlot } from '@/components/plots/lazy-reckoner-plot';
import { CautionList } from '@/features/procedures/components/caution-list';

interface Props {
  result: BlockSnapshot | undefined;
  unclaimed: FieldError[];
  failure: string | null;
  /** The document's readings: bands on the block's outputs are drawn on its picture. */
  readings?: readonly ResolvedReading[];
}

/** The live outputs of a reckoner (value + unit, explanation) and its cautions, or why there are none. */
export function ReckonerResults({ result, unclaimed, failure, readings = [] }: Props) {
  if (failure)
    return (
      <p className="mt-3 text-sm text-out" role="alert">
        Could not evaluate the procedure: {failure}
      </p>
    );
  if (!result) return <p className="mt-3 text-sm text-graphite-soft">Not evaluated yet.</p>;
  if (!result.ok) {
    return (
      <div className="mt-3 rounded border border-out bg-out-wash px-3 py-2 text-sm text-out" role="status">
        <p className="font-semibold">No results until the inputs are fixed.</p>
        {unclaimed.length > 0 && (
          <ul className="mt-1 list-disc pl-5">
            {unclaimed.map((e) => (
              <li key={e.field + e.reason}>
                {withLabel(inputLabel(getReckoner(result.kind)?.fields ?? [], e.field), e.reason)}
              </li>
            ))}
          </ul>
        )}
      </div>
    );
  }
  return (
    <div className="mt-3 flex flex-col gap-3">
      <dl
        className="grid grid-cols-1 gap-x-4 gap-y-2 rounded border border-rule bg-paper px-3 py-2 sm:grid-cols-2"
        aria-label={`Results of ${result.name}`}
      >
        {Object.entries(result.outputs).map(([key, out]) => (
          <div key={key} data-output={key} className="flex flex-col">
            <dt className="text-xs text-graphite-soft">{out.label}</dt>
            <dd data-figure className="text-base">
              <Figure formatted={out.formatted} measure={out.measure} strong />
            </dd>
            <dd className="text-xs text-graphite-soft">{out.explanation}</dd>
          </div>
        ))}
      </dl>
      <LazyReckonerPlot block={result} readings={readings} />
      <CautionList cautions={result.cautions} />
    </div>
  );
}
