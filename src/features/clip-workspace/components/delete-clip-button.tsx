import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Trash2 } from 'lucide-react';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError } from '@/components/ui/field';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { api, errorMessage } from '@/lib/api-client';

/** Erases the clip on request (the head coach, or the coach who uploaded it), after saying what goes. */
export function DeleteClipButton({ clip }: { clip: ClipDto }) {
  const [open, setOpen] = useState(false);
  const navigate = useNavigate();
  const toast = useToast();
  const queryClient = useQueryClient();
  const erase = useMutation({
    mutationFn: () => api.delete<void>(`/api/clips/${encodeURIComponent(clip.id)}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: ['clip-workspace', 'clip', clip.id] });
      void queryClient.invalidateQueries();
      toast.success(`${clip.originalName} was deleted`);
      void navigate(paths.session.href(clip.sessionId), { replace: true });
    },
  });
  return (
    <>
      <Button
        variant="quiet"
        icon={<Trash2 aria-hidden="true" className="h-4 w-4" />}
        onClick={() => setOpen(true)}
      >
        Delete clip
      </Button>
      <Dialog open={open} onClose={() => setOpen(false)} title="Delete this clip for good?">
        <div className="space-y-4 text-sm text-granite-800">
          <p>
            {clip.originalName} goes, with everything made from it: the video and its copies, every analysed
            frame and turn, its flags, notes and drawings, the reviews of it (athletes and guardians lose them
            at once) and side-by-side stills that show it. This cannot be undone.
          </p>
          <p className="text-granite-600">
            The club&apos;s record keeps only that a clip was deleted, by whom and when.
          </p>
          <FormError message={erase.isError ? errorMessage(erase.error) : null} />
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Keep it
            </Button>
            <Button variant="danger" busy={erase.isPending} onClick={() => erase.mutate()}>
              Delete the clip
            </Button>
          </div>
        </div>
      </Dialog>
    </>
  );
}
