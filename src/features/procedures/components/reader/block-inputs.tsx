import type { InputRow } from '@shared/document/block-view';
import { Figure } from '@/components/ui/figure';

/** What a block assumes: each input in the registry's words, its value and where the value came from. */
export function BlockInputs({ inputs, name }: { inputs: InputRow[]; name: string }) {
  return (
    <table aria-label={`Inputs of ${name}`} className="w-full text-left text-sm">
      <thead className="border-b border-rule text-xs text-graphite-soft">
        <tr>
          <th scope="col" className="w-1/2 py-1 pr-3 font-normal">
            Input
          </th>
          <th scope="col" className="py-1 pr-3 font-normal">
            Value
          </th>
          <th scope="col" className="py-1 font-normal max-sm:hidden">
            From
          </th>
        </tr>
      </thead>
      <tbody>
        {inputs.map((i) => (
          <tr key={i.path} data-input={i.path} className="border-b border-rule align-top last:border-0">
            <td className="py-1 pr-3">{i.label}</td>
            <td className="py-1 pr-3">
              <Figure formatted={i.formatted} measure={i.measure} />
              {/* On a phone the source goes under the value instead of in its own column. */}
              <span className="block text-xs text-graphite-soft sm:hidden">{i.sourceText}</span>
            </td>
            <td className="py-1 text-xs text-graphite-soft max-sm:hidden">{i.sourceText}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
