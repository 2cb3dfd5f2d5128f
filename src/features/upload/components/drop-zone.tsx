import { useState } from 'react';
import { UploadCloud } from 'lucide-react';
import { cn } from '@/lib/format';
import { ACCEPT_ATTRIBUTE, ACCEPTED_FORMATS_TEXT } from '../utils/check-clip-file';

export function DropZone({ onFiles }: { onFiles: (files: File[]) => void }) {
  const [over, setOver] = useState(false);
  return (
    <label
      onDragOver={(event) => {
        event.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(event) => {
        event.preventDefault();
        setOver(false);
        onFiles(Array.from(event.dataTransfer.files));
      }}
      className={cn(
        'flex cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed px-6 py-8 text-center transition-colors',
        over ? 'border-glacier-500 bg-glacier-50' : 'border-granite-200 bg-white hover:border-glacier-300',
      )}
    >
      <UploadCloud aria-hidden="true" className="h-8 w-8 text-glacier-500" />
      <span className="mt-2 text-sm font-medium text-granite-900">Drop clips here or choose files</span>
      <span className="mt-1 text-xs text-granite-600">Several at once; {ACCEPTED_FORMATS_TEXT}.</span>
      <input
        type="file"
        multiple
        accept={ACCEPT_ATTRIBUTE}
        aria-label="Choose clips"
        className="sr-only"
        onChange={(event) => {
          onFiles(Array.from(event.target.files ?? []));
          event.target.value = '';
        }}
      />
    </label>
  );
}
