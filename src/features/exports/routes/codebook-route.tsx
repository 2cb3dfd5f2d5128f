import { useState } from 'react';
import { Link } from 'react-router-dom';
import { EXPORT_KINDS, type ExportKind } from '@shared/exports/codebook';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { cn } from '@/lib/format';
import { useCodebook } from '../api/exports-api';
import { CodebookTable } from '../components/codebook-table';

const TITLES: Record<ExportKind, string> = {
  frames: 'frames.csv',
  keypoints: 'keypoints.csv',
  turns: 'turns.csv',
};

/** The codebook on its own page: every column of every export, for anyone who opens an export file. */
export function CodebookRoute() {
  const codebook = useCodebook();
  const [kind, setKind] = useState<ExportKind>('frames');
  return (
    <>
      <PageHeader
        title="Codebook"
        subtitle="What every column of a Stanceline export means: definition, unit, sign, camera view, and what an empty cell says."
        back={
          <Link to={paths.exports.href()} className="text-glacier-700 hover:underline">
            ← Exports
          </Link>
        }
      />
      {codebook.isPending ? <PageSpinner label="Loading the codebook" /> : null}
      {codebook.isError ? (
        <QueryError error={codebook.error} what="the codebook" retry={() => void codebook.refetch()} />
      ) : null}
      {codebook.data ? (
        <div className="space-y-3">
          <div role="tablist" aria-label="Export file" className="flex flex-wrap gap-1">
            {EXPORT_KINDS.map((k) => (
              <button
                key={k}
                type="button"
                role="tab"
                aria-selected={k === kind}
                onClick={() => setKind(k)}
                className={cn(
                  'rounded-md px-3 py-1 font-mono text-sm',
                  k === kind ? 'bg-glacier-100 text-glacier-900' : 'text-granite-600 hover:bg-granite-50',
                )}
              >
                {TITLES[k]}
              </button>
            ))}
          </div>
          <p className="text-sm text-granite-700">{codebook.data.numbers}</p>
          {kind === 'frames' ? <p className="text-sm text-granite-700">{codebook.data.smoothing}</p> : null}
          <CodebookTable columns={codebook.data.columns} kind={kind} />
        </div>
      ) : null}
    </>
  );
}
