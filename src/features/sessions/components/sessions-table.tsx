import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { SessionDto } from '@shared/schemas/session.schema';
import { DataTable } from '@/components/ui/data-table';
import { paths } from '@/config/paths';
import { formatDay } from '@/lib/format';
import { disciplineLabel, SNOW_LABELS } from './session-labels';

const column = createColumnHelper<SessionDto>();

const columns = [
  column.accessor('date', {
    header: 'Date',
    cell: (info) => (
      <Link
        to={paths.session.href(info.row.original.id)}
        className="font-medium text-glacier-700 hover:text-glacier-900 hover:underline"
      >
        {formatDay(info.getValue())}
      </Link>
    ),
  }),
  column.accessor('venue', { header: 'Venue' }),
  column.accessor('discipline', { header: 'Discipline', cell: (info) => disciplineLabel(info.getValue()) }),
  column.accessor('snow', { header: 'Snow', cell: (info) => SNOW_LABELS[info.getValue()] }),
  column.accessor('clipCount', {
    header: 'Clips',
    cell: (info) => <span className="font-mono tabular-nums">{info.getValue()}</span>,
  }),
];

export function SessionsTable({ sessions }: { sessions: SessionDto[] }) {
  return (
    <DataTable
      caption="Training sessions"
      columns={columns}
      data={sessions}
      getRowId={(session) => session.id}
      initialSorting={[{ id: 'date', desc: true }]}
    />
  );
}
