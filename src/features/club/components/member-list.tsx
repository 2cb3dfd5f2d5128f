import type { Role } from '@shared/schemas/auth.schema';
import type { ClubMemberListResponse } from '@shared/schemas/club.schema';
import { Badge } from '@/components/ui/badge';
import { formatDateTime } from '@/lib/format';
import { ROLE_LABELS } from '@/lib/permissions';

const ROLE_ORDER: Role[] = ['head_coach', 'coach', 'analyst', 'athlete', 'guardian'];

export function MemberList({ data }: { data: ClubMemberListResponse }) {
  const members = [...data.members].sort(
    (a, b) => ROLE_ORDER.indexOf(a.role) - ROLE_ORDER.indexOf(b.role) || a.name.localeCompare(b.name),
  );
  return (
    <div className="space-y-6">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Club members</caption>
        <thead className="border-b border-granite-200 text-xs tracking-wide text-granite-600 uppercase">
          <tr>
            <th scope="col" className="py-2 pr-4 font-medium">
              Name
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Role
            </th>
            <th scope="col" className="py-2 font-medium">
              Linked to
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-granite-100">
          {members.map((member) => (
            <tr key={member.id}>
              <td className="py-2 pr-4">
                <p className="font-medium text-granite-900">{member.name}</p>
                <p className="text-xs text-granite-600">{member.email}</p>
              </td>
              <td className="py-2 pr-4">
                <Badge tone={member.role === 'head_coach' || member.role === 'coach' ? 'info' : 'neutral'}>
                  {ROLE_LABELS[member.role]}
                </Badge>
              </td>
              <td className="py-2 text-granite-700">
                {member.role === 'coach'
                  ? member.ageGroups.join(', ') || 'No group yet'
                  : member.athletes.map((a) => a.name).join(', ') || '–'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {data.invitations.length > 0 ? (
        <div>
          <h3 className="mb-2 text-sm font-semibold text-granite-900">Invitations not yet accepted</h3>
          <ul className="divide-y divide-granite-100 text-sm">
            {data.invitations.map((invitation) => (
              <li key={invitation.id} className="flex flex-wrap justify-between gap-2 py-2">
                <span>
                  {invitation.email} · {ROLE_LABELS[invitation.role]}
                </span>
                <span className="text-xs text-granite-600">
                  expires {formatDateTime(invitation.expiresAt)}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
