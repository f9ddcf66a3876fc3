import type { BlockSnapshot } from '@shared/document/evaluate';
import { CautionList } from '../caution-list';

/** A reckoner as the reader sees it: its computed values with units, from the stored snapshot. */
export function ReckonerCard({ block, name }: { block: BlockSnapshot | undefined; name: string }) {
  return (
    <section className="not-prose my-4 rounded-lg border border-rule bg-card p-4" data-reckoner={name}>
      <h3 className="text-sm font-semibold uppercase tracking-wide text-accent-deep">
        {block?.label ?? 'Calculation'} <span className="value normal-case text-graphite-soft">· {name}</span>
      </h3>
      {!block ? (
        <p className="mt-2 text-sm text-out">This calculation is missing from the stored results.</p>
      ) : !block.ok ? (
        <div className="mt-2 text-sm text-out">
          <p className="font-semibold">No results: the inputs have problems.</p>
          <ul className="list-disc pl-5">
            {block.errors.map((e) => (
              <li key={e.field + e.reason}>
                {e.field && <span className="value">{e.field}</span>} {e.reason}
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <>
          <dl className="mt-2 grid gap-x-6 gap-y-2 sm:grid-cols-2">
            {Object.entries(block.outputs).map(([key, out]) => (
              <div key={key} data-output={key}>
                <dt className="text-xs text-graphite-soft">{out.label}</dt>
                <dd className="value text-base font-semibold">{out.formatted}</dd>
              </div>
            ))}
          </dl>
          <div className="mt-3">
            <CautionList cautions={block.cautions} />
          </div>
        </>
      )}
    </section>
  );
}
