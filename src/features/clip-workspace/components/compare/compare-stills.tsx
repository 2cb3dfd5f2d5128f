import { useEffect, useState } from 'react';
import type { CompareStillDto } from '@shared/schemas/plan.schema';
import { Spinner } from '@/components/ui/spinner';
import { formatDay } from '@/lib/format';
import { compareStillImage, useCompareStills } from '../../api/compare-api';

/** A kept still as an object URL (the image needs the sign-in, so an <img src> cannot fetch it). */
export function useStillImageUrl(id: string): { url: string | null; failed: boolean } {
  const [url, setUrl] = useState<string | null>(null);
  const [failed, setFailed] = useState(false);
  useEffect(() => {
    let objectUrl: string | null = null;
    let cancelled = false;
    compareStillImage(id)
      .then((blob) => {
        if (cancelled) return;
        objectUrl = URL.createObjectURL(blob);
        setUrl(objectUrl);
      })
      .catch(() => !cancelled && setFailed(true));
    return () => {
      cancelled = true;
      if (objectUrl) URL.revokeObjectURL(objectUrl);
    };
  }, [id]);
  return { url, failed };
}

function StillImage({ still }: { still: CompareStillDto }) {
  const { url, failed } = useStillImageUrl(still.id);
  if (failed) return <p className="text-xs text-alarm-600">The image could not be loaded.</p>;
  if (!url) return <Spinner size="sm" label="Loading the still" />;
  return (
    <a href={url} download={`side-by-side-${still.id.slice(0, 8)}.png`}>
      <img
        src={url}
        alt={still.caption || `Frames ${still.frameA} and ${still.frameB} side by side`}
        className="w-full rounded"
      />
    </a>
  );
}

/** Stills kept with this pair of clips, newest first; a review can include them later. */
export function CompareStills({ a, b }: { a: string; b: string }) {
  const stills = useCompareStills(a, b);
  if (stills.isPending) return <Spinner size="sm" label="Loading kept stills" />;
  if (stills.isError) return <p className="text-sm text-alarm-600">The kept stills could not be loaded.</p>;
  const list = stills.data.stills;
  return (
    <section aria-labelledby="kept-stills" className="space-y-2">
      <h2 id="kept-stills" className="text-base font-semibold text-granite-900">
        Stills kept with these two clips
      </h2>
      {list.length === 0 ? (
        <p className="text-sm text-granite-600">
          None yet. “Keep a side-by-side still” saves both frames with their overlays.
        </p>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2">
          {list.map((still) => (
            <li key={still.id} className="space-y-1 rounded-lg border border-granite-200 bg-white p-2">
              <StillImage still={still} />
              <p className="text-xs text-granite-600">
                {still.caption ? `${still.caption} · ` : ''}frames {still.frameA} and {still.frameB} ·{' '}
                {formatDay(still.createdAt)}
                {still.createdBy ? ` · ${still.createdBy}` : ''}
              </p>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
