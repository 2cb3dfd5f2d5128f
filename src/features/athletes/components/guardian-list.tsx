import type { GuardianDto } from '@shared/schemas/athlete.schema';
import { Card } from '@/components/ui/page-header';

export function GuardianList({ guardians }: { guardians: GuardianDto[] }) {
  return (
    <Card title="Guardians">
      {guardians.length === 0 ? (
        <p className="text-sm text-granite-600">No guardian is linked to this athlete yet.</p>
      ) : (
        <ul className="divide-y divide-granite-100 text-sm">
          {guardians.map((guardian) => (
            <li key={guardian.id} className="flex flex-wrap justify-between gap-2 py-2 first:pt-0 last:pb-0">
              <span className="font-medium text-granite-900">{guardian.name}</span>
              {guardian.email ? (
                <a className="text-glacier-700 hover:underline" href={`mailto:${guardian.email}`}>
                  {guardian.email}
                </a>
              ) : (
                <span className="text-granite-400">Contact details hidden for your role</span>
              )}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
