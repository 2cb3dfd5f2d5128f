import { Link } from 'react-router-dom';

interface StatTileProps {
  label: string;
  value: number | undefined;
  to: string;
  note?: string;
}

export function StatTile({ label, value, to, note }: StatTileProps) {
  return (
    <Link
      to={to}
      className="block rounded-lg border border-granite-200 bg-white p-4 shadow-sm transition-colors hover:border-glacier-300"
    >
      <p className="text-xs font-medium tracking-wide text-granite-600 uppercase">{label}</p>
      <p className="mt-1 font-mono text-3xl text-glacier-900 tabular-nums">{value ?? '–'}</p>
      {note ? <p className="mt-1 text-xs text-granite-600">{note}</p> : null}
    </Link>
  );
}
