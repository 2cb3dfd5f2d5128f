import { useEffect, useId, useState, type FormEvent } from 'react';
import { Pencil, PenTool, Trash2 } from 'lucide-react';
import { createNoteSchema, MAX_NOTE_LENGTH } from '@shared/schemas/note.schema';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/field';
import { Spinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUser } from '@/lib/auth';
import { cn } from '@/lib/format';
import { useCreateNote } from '../../api/create-note';
import { useDeleteNote } from '../../api/delete-note';
import { useClipNotes, type NoteDto } from '../../api/get-clip-notes';
import { useUpdateNote } from '../../api/update-note';
import { formatClipTime, frameStartMs } from '../../lib/frame-time';
import { useAnnotations } from '../stage/annotations-context';
import { useStage, useStageClock } from '../stage/stage-context';
import { drawingDraft, useDrawingDraft } from './drawing-draft';
import { noteFrame } from './note-frame';
import { isDrawingEmpty } from './drawing-geometry';
import { DrawingTools } from './drawing-tools';

export function NotesPanel() {
  const { clip, canEdit: canWrite } = useStage();
  const user = useUser();
  const notes = useClipNotes(clip.id);
  const list = notes.data ?? [];

  return (
    <section aria-labelledby="notes-title" className="rounded-lg border border-granite-200 bg-white p-4">
      <h2 id="notes-title" className="font-semibold text-granite-900">
        Notes <span className="font-mono text-sm font-normal text-granite-600">({list.length})</span>
      </h2>
      {canWrite ? <NoteComposer /> : null}
      {notes.isPending ? (
        <div className="mt-3">
          <Spinner size="sm" label="Loading notes" />
        </div>
      ) : notes.isError ? (
        <div className="mt-3">
          <FormError message={`The notes could not be loaded: ${notes.error.message}`} />
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void notes.refetch()}>
            Try again
          </Button>
        </div>
      ) : list.length === 0 ? (
        <p className="mt-3 text-sm text-granite-600">
          No notes on this clip yet.{canWrite ? ' Pause on a moment, write what you see and add it.' : ''}
        </p>
      ) : (
        <ol className="mt-3 space-y-2" aria-label="Notes on this clip">
          {list.map((note) => (
            <NoteItem key={note.id} note={note} own={note.author?.id === user.id} />
          ))}
        </ol>
      )}
    </section>
  );
}

function NoteComposer() {
  const { clip, fps, clock, pause, seekToFrame } = useStage();
  const { drawingActive, setDrawingActive } = useAnnotations();
  const toast = useToast();
  const create = useCreateNote(clip.id);
  const draft = useDrawingDraft();
  const [text, setText] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const textId = useId();

  useEffect(() => {
    if (draft.clipId !== clip.id) drawingDraft.reset(clip.id);
  }, [clip.id, draft.clipId]);
  // Leaving the page ends drawing mode so the overlay takes the pointer again.
  useEffect(() => () => setDrawingActive(false), [setDrawingActive]);

  // While the clip plays, the note goes to the frame where it stops: the label waits for a pause
  // instead of re-rendering the panel on every frame.
  const pausedFrame = useStageClock((s) => (s.playing ? null : s.frame));
  const onDraftFrame = useStageClock((s) => s.frame === draft.frameIndex);
  const hasDrawing = !isDrawingEmpty(draft.drawing);
  const shownFrame = hasDrawing && draft.frameIndex !== null ? draft.frameIndex : pausedFrame;
  const offFrame = hasDrawing && draft.frameIndex !== null && !onDraftFrame;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const frame = shownFrame ?? clock.get().frame;
    const parsed = createNoteSchema.safeParse({
      frameIndex: frame,
      timeMs: Math.round(frameStartMs(frame, fps) * 1000) / 1000,
      text,
      ...(hasDrawing ? { drawing: draft.drawing } : {}),
    });
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'The note cannot be saved as it is.');
      return;
    }
    setProblem(null);
    create.mutate(parsed.data, {
      onSuccess: () => {
        setText('');
        drawingDraft.reset(clip.id);
        setDrawingActive(false);
        toast.success(`Note added at ${formatClipTime(frameStartMs(frame, fps))}.`);
      },
      // The text and drawing stay in the form, so nothing is lost on a failed save.
      onError: (error) => setProblem(`The note was not saved: ${errorMessage(error)}`),
    });
  };

  return (
    <form onSubmit={submit} className="mt-3 space-y-2" aria-label="New note">
      <label
        htmlFor={textId}
        className="flex items-baseline justify-between text-sm font-medium text-granite-800"
      >
        Note text
        <span className="font-mono text-xs font-normal text-granite-600 tabular-nums">
          {shownFrame === null
            ? 'at the frame where you pause'
            : `at ${formatClipTime(frameStartMs(shownFrame, fps))} · frame ${shownFrame}`}
        </span>
      </label>
      <textarea
        id={textId}
        value={text}
        maxLength={MAX_NOTE_LENGTH}
        onChange={(e) => setText(e.target.value)}
        rows={3}
        placeholder="e.g. Inside hand drops before the apex"
        className="block w-full rounded-md border border-granite-200 px-3 py-2 text-sm placeholder:text-granite-400 focus:outline-2 focus:outline-glacier-500"
      />
      <div className="flex flex-wrap items-center gap-2">
        <Button
          variant="secondary"
          size="sm"
          aria-pressed={drawingActive}
          icon={<PenTool aria-hidden="true" className="h-4 w-4" />}
          onClick={() => {
            if (!drawingActive) pause();
            setDrawingActive(!drawingActive);
          }}
        >
          {drawingActive ? 'Stop drawing' : 'Draw on frame'}
        </Button>
        {hasDrawing ? (
          <span className="text-xs text-granite-600">
            Drawing: {draft.drawing.strokes.length} line{draft.drawing.strokes.length === 1 ? '' : 's'},{' '}
            {draft.drawing.arrows.length} arrow{draft.drawing.arrows.length === 1 ? '' : 's'},{' '}
            {draft.drawing.angles.length} angle{draft.drawing.angles.length === 1 ? '' : 's'}
          </span>
        ) : null}
      </div>
      {drawingActive ? <DrawingTools /> : null}
      {offFrame ? (
        <p className="flex flex-wrap items-center gap-2 rounded-md bg-signal-400/15 px-2 py-1.5 text-xs text-granite-800">
          The drawing belongs to frame {draft.frameIndex}; the note will be pinned there.
          <Button variant="quiet" size="sm" onClick={() => seekToFrame(draft.frameIndex ?? 0)}>
            Go to frame {draft.frameIndex}
          </Button>
        </p>
      ) : null}
      <FormError message={problem} />
      <div className="flex justify-end">
        <Button type="submit" size="sm" busy={create.isPending}>
          Add note
        </Button>
      </div>
    </form>
  );
}

function NoteItem({ note, own }: { note: NoteDto; own: boolean }) {
  const { clip, fps, frameCount, seekToFrame } = useStage();
  const toast = useToast();
  const update = useUpdateNote(clip.id);
  const remove = useDeleteNote(clip.id);
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [text, setText] = useState(note.text);
  const [problem, setProblem] = useState<string | null>(null);
  const frame = noteFrame(note, fps, frameCount);
  // Flips when the clip reaches or leaves the note's frame, not on every frame in between.
  const here = useStageClock((s) => s.frame === frame);
  const drawn = !isDrawingEmpty(note.drawing);

  const save = () => {
    const trimmed = text.trim();
    if (!trimmed) {
      setProblem('A note needs some text. Delete it instead if it is no longer needed.');
      return;
    }
    update.mutate(
      { noteId: note.id, input: { text: trimmed } },
      {
        onSuccess: () => {
          setEditing(false);
          setProblem(null);
        },
        onError: (error) => setProblem(`The change was not saved: ${errorMessage(error)}`),
      },
    );
  };

  return (
    <li
      className={cn(
        'rounded-md border px-3 py-2',
        here ? 'border-glacier-400 bg-glacier-50' : 'border-granite-200 bg-white',
      )}
      aria-current={here ? 'true' : undefined}
    >
      <button
        type="button"
        onClick={() => seekToFrame(frame)}
        className="block w-full text-left"
        aria-label={`Go to ${formatClipTime(note.timeMs)}, frame ${frame}: ${note.text}`}
      >
        <span className="flex items-center gap-2 font-mono text-xs text-glacier-700 tabular-nums">
          {formatClipTime(note.timeMs)} · frame {frame}
          {drawn ? (
            <span className="inline-flex items-center gap-0.5 font-sans text-granite-600">
              <PenTool aria-hidden="true" className="h-3 w-3" /> drawing
            </span>
          ) : null}
        </span>
        {editing ? null : (
          <span className="mt-0.5 block text-sm whitespace-pre-wrap text-granite-900">{note.text}</span>
        )}
      </button>
      {editing ? (
        <div className="mt-1 space-y-1.5">
          <label className="sr-only" htmlFor={`edit-${note.id}`}>
            Edit note text
          </label>
          <textarea
            id={`edit-${note.id}`}
            value={text}
            maxLength={MAX_NOTE_LENGTH}
            onChange={(e) => setText(e.target.value)}
            rows={3}
            className="block w-full rounded-md border border-granite-200 px-2 py-1.5 text-sm focus:outline-2 focus:outline-glacier-500"
          />
          <FormError message={problem} />
          <div className="flex justify-end gap-1">
            <Button
              variant="quiet"
              size="sm"
              onClick={() => {
                setEditing(false);
                setText(note.text);
                setProblem(null);
              }}
            >
              Cancel
            </Button>
            <Button size="sm" busy={update.isPending} onClick={save}>
              Save note
            </Button>
          </div>
        </div>
      ) : (
        <div className="mt-1 flex items-center gap-2 text-xs text-granite-600">
          <span>{note.author?.name ?? 'Former member'}</span>
          {own && !confirming ? (
            <span className="ml-auto flex gap-1">
              <button
                type="button"
                className="inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-glacier-700 hover:bg-glacier-50"
                onClick={() => setEditing(true)}
              >
                <Pencil aria-hidden="true" className="h-3 w-3" /> Edit
              </button>
              <button
                type="button"
                className="inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-alarm-600 hover:bg-alarm-500/10"
                onClick={() => setConfirming(true)}
              >
                <Trash2 aria-hidden="true" className="h-3 w-3" /> Delete
              </button>
            </span>
          ) : null}
          {confirming ? (
            <span className="ml-auto flex items-center gap-1">
              Delete this note?
              <Button
                variant="danger"
                size="sm"
                busy={remove.isPending}
                onClick={() =>
                  remove.mutate(note.id, {
                    onSuccess: () => toast.success('Note deleted.'),
                    onError: (error) => {
                      setConfirming(false);
                      toast.error(`The note was not deleted: ${errorMessage(error)}`);
                    },
                  })
                }
              >
                Delete
              </Button>
              <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
                Keep
              </Button>
            </span>
          ) : null}
        </div>
      )}
    </li>
  );
}
