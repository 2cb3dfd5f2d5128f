import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { CalendarPlus } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';
import { formatDay } from '@/lib/format';
import { useSessions } from '../api/get-sessions';
import { CreateSessionForm } from '../components/create-session-form';
import { SessionsTable } from '../components/sessions-table';

export function SessionsRoute() {
  const user = useUser();
  const toast = useToast();
  const navigate = useNavigate();
  const sessions = useSessions();
  const [creating, setCreating] = useState(false);
  const canCreate = can(user.role, 'sessions.create');

  return (
    <>
      <PageHeader
        title="Sessions"
        subtitle="Training days: where, what was trained, and the clips filmed."
        actions={
          canCreate ? (
            <Button
              icon={<CalendarPlus aria-hidden="true" className="h-4 w-4" />}
              onClick={() => setCreating(true)}
            >
              New session
            </Button>
          ) : null
        }
      />
      {sessions.isPending ? <PageSpinner label="Loading sessions" /> : null}
      {sessions.isError ? (
        <QueryError error={sessions.error} what="sessions" retry={() => void sessions.refetch()} />
      ) : null}
      {sessions.data ? (
        sessions.data.length === 0 ? (
          <EmptyState
            title="No sessions yet"
            action={canCreate ? <Button onClick={() => setCreating(true)}>New session</Button> : null}
          >
            {canCreate
              ? 'Create a session for each training day, then upload its clips.'
              : 'Sessions appear here once a coach creates them.'}
          </EmptyState>
        ) : (
          <SessionsTable sessions={sessions.data} />
        )
      ) : null}
      {canCreate ? (
        <Dialog open={creating} onClose={() => setCreating(false)} title="New training session">
          <CreateSessionForm
            onCancel={() => setCreating(false)}
            onCreated={(session) => {
              setCreating(false);
              toast.success(`Session on ${formatDay(session.date)} created.`);
              navigate(paths.session.href(session.id));
            }}
          />
        </Dialog>
      ) : null}
    </>
  );
}
