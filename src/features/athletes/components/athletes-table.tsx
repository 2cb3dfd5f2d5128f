import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { AthleteDto } from '@shared/schemas/athlete.schema';
import { DataTable } from '@/components/ui/data-table';
import { paths } from '@/config/paths';
import { ConsentBadge } from './consent-badge';

const column = createColumnHelper<AthleteDto>();

const columns = [
  column.accessor((athlete) => `${athlete.lastName}, ${athlete.firstName}`, {
    id: 'name',
    header: 'Athlete',
    cell: (info) => (
      <Link
        to={paths.athlete.href(info.row.original.id)}
        className="font-medium text-glacier-700 hover:text-glacier-900 hover:underline"
      >
        {info.row.original.firstName} {info.row.original.lastName}
      </Link>
    ),
  }),
  column.accessor((athlete) => athlete.ageGroup.minAge, {
    id: 'ageGroup',
    header: 'Age group',
    cell: (info) => info.row.original.ageGroup.name,
  }),
  column.accessor('birthYear', { header: 'Born' }),
  column.accessor((athlete) => athlete.consent.status, {
    id: 'consent',
    header: 'Consent',
    cell: (info) => <ConsentBadge status={info.getValue()} />,
  }),
  column.accessor('clipCount', {
    header: 'Clips',
    cell: (info) => <span className="font-mono tabular-nums">{info.getValue()}</span>,
  }),
];

export function AthletesTable({ athletes }: { athletes: AthleteDto[] }) {
  return (
    <DataTable
      caption="Athletes"
      columns={columns}
      data={athletes}
      getRowId={(athlete) => athlete.id}
      initialSorting={[{ id: 'name', desc: false }]}
    />
  );
}
