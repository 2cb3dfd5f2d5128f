import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Trash2 } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, TextField } from '@/components/ui/field';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { api, errorMessage } from '@/lib/api-client';

/** The head coach erases an athlete on request, after typing their name to confirm. */
export function EraseAthleteButton({
  athlete,
}: {
  athlete: { id: string; firstName: string; lastName: string };
}) {
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState('');
  const navigate = useNavigate();
  const toast = useToast();
  const queryClient = useQueryClient();
  const name = `${athlete.firstName} ${athlete.lastName}`;
  const erase = useMutation({
    mutationFn: () => api.delete<{ clips: number }>(`/api/athletes/${encodeURIComponent(athlete.id)}`),
    onSuccess: (result) => {
      void queryClient.invalidateQueries();
      toast.success(`${name} was erased, with ${result.clips} ${result.clips === 1 ? 'clip' : 'clips'}`);
      void navigate(paths.athletes.href(), { replace: true });
    },
  });
  return (
    <>
      <Button
        variant="quiet"
        icon={<Trash2 aria-hidden="true" className="h-4 w-4" />}
        onClick={() => setOpen(true)}
      >
        Erase athlete
      </Button>
      <Dialog open={open} onClose={() => setOpen(false)} title={`Erase ${name} on request?`}>
        <div className="space-y-4 text-sm text-granite-800">
          <p>
            Everything of {athlete.firstName} goes: every clip that shows them (with its frames, flags, notes,
            reviews and stills, even where teammates are tagged too), their season plan, consent record and
            account, and the accounts of guardians who have no other child in the club. This cannot be undone.
          </p>
          <p className="text-granite-600">
            The club&apos;s record keeps only that an athlete was erased, by whom and when. Follow your
            club&apos;s policy and local rules for requests like this.
          </p>
          <TextField
            label={`Type ${name} to confirm`}
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
          />
          <FormError message={erase.isError ? errorMessage(erase.error) : null} />
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Keep
            </Button>
            <Button
              variant="danger"
              busy={erase.isPending}
              disabled={typed.trim() !== name}
              onClick={() => erase.mutate()}
            >
              Erase {athlete.firstName}
            </Button>
          </div>
        </div>
      </Dialog>
    </>
  );
}
