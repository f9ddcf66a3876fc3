import type { BlockView } from '@shared/document/block-view';
import { withLabel } from '@shared/schemas/problems';
import type { BlockSnapshot, ResolvedReading } from '@shared/document/evaluate';
import { LazyReckonerPlot } from '@/components/plots/lazy-reckoner-plot';
import { CautionList } from '../caution-list';
import { BlockInputs } from './block-inputs';
import { Figure } from '@/components/ui/figure';

const heading = 'text-xs font-semibold uppercase tracking-wide text-graphite-soft';

/** A reckoner as the reader and reviewer see it: what it assumes beside what it gives, in the author's order. */
export function ReckonerCard({
  view,
  name,
  block,
  readings,
}: {
  view: BlockView | undefined;
  name: string;
  /** The stored result, for the block's picture. */
  block?: BlockSnapshot;
  readings?: readonly ResolvedReading[];
}) {
  return (
    <section className="not-prose my-4 rounded-lg border border-rule bg-card p-4" data-reckoner={name}>
      <h3 className="text-sm font-semibold uppercase tracking-wide text-accent-deep">
        {view?.label ?? 'Calculation'}
      </h3>
      {!view ? (
        <p className="mt-2 text-sm text-out">This calculation is missing from the stored results.</p>
      ) : (
        <div className="mt-2 grid grid-cols-1 gap-4">
          {view.inputs.length > 0 && (
            <div>
              <h4 className={heading}>Assumed</h4>
              <BlockInputs inputs={view.inputs} name={view.label} />
            </div>
          )}
          <div>
            <h4 className={heading}>Results</h4>
            {view.ok ? (
              <>
                <dl className="mt-1 grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-2 md:grid-cols-3">
                  {view.outputs.map((out) => (
                    <div
                      key={out.key}
                      data-output={out.key}
                      className={
                        typeof out.value === 'string' && out.formatted.length > 24
                          ? 'col-span-full'
                          : undefined
                      }
                    >
                      <dt className="text-xs text-graphite-soft">{out.label}</dt>
                      <dd className="text-base">
                        <Figure formatted={out.formatted} measure={out.measure} strong />
                      </dd>
                    </div>
                  ))}
                </dl>
                <LazyReckonerPlot block={block} readings={readings ?? []} />
                <div className="mt-3">
                  <CautionList cautions={view.cautions} />
                </div>
              </>
            ) : (
              <div className="mt-1 text-sm text-out">
                <p className="font-semibold">No results: the inputs have problems.</p>
                <ul className="list-disc pl-5">
                  {view.errors.map((e) => (
                    <li key={e.field + e.reason}>{withLabel(e.field, e.reason)}</li>
                  ))}
                </ul>
              </div>
            )}
          </div>
        </div>
      )}
    </section>
  );
}
