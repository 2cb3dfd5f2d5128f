import type { CodebookColumn, ExportKind } from '@shared/exports/codebook';

/** Every column of one export, with its unit, sign, view and what an empty cell means. */
export function CodebookTable({ columns, kind }: { columns: CodebookColumn[]; kind: ExportKind }) {
  const shown = columns.filter((c) => c.export === kind);
  return (
    <div className="max-h-[36rem] overflow-auto rounded-lg border border-granite-200 bg-white">
      <table className="w-full text-xs">
        <caption className="sr-only">Codebook of the {kind} export</caption>
        <thead className="sticky top-0 bg-granite-50 text-left text-granite-600">
          <tr>
            <th scope="col" className="px-2 py-1.5 font-medium">
              Column
            </th>
            <th scope="col" className="px-2 py-1.5 font-medium">
              Meaning
            </th>
          </tr>
        </thead>
        <tbody>
          {shown.map((c) => (
            <tr key={c.name} className="border-t border-granite-100 align-top">
              <th
                scope="row"
                className="px-2 py-1.5 text-left font-mono font-medium whitespace-nowrap text-granite-900"
              >
                {c.name}
              </th>
              <td className="px-2 py-1.5 text-granite-700">
                {c.definition}
                <span className="block text-granite-500">
                  {[
                    c.unit ? `unit: ${c.unit}` : null,
                    c.sign ? `sign: ${c.sign}` : null,
                    c.view ? `view: ${c.view}` : null,
                    c.empty ? `empty: ${c.empty}` : null,
                  ]
                    .filter(Boolean)
                    .join(' · ')}
                </span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
