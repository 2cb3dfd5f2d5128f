import { PageHeader } from '@/components/ui/page-header';
import { useUser } from '@/lib/auth';
import { ROLE_LABELS } from '@/lib/permissions';
import { ChangePasswordForm } from '../components/change-password-form';

/** The signed-in member's own account: who they are, and their password. */
export function AccountRoute() {
  const user = useUser();
  return (
    <>
      <PageHeader
        title="Your account"
        subtitle={`${user.name} · ${user.email} · ${ROLE_LABELS[user.role]}`}
      />
      <section className="rounded-lg border border-granite-200 bg-white p-4">
        <h2 className="mb-1 font-semibold text-granite-900">Password</h2>
        <p className="mb-4 text-sm text-granite-600">
          Changing it signs you out on every other phone, tablet and computer.
        </p>
        <ChangePasswordForm />
      </section>
    </>
  );
}
