import type { ClipStatus } from '@shared/schemas/clip.schema';
import { Badge } from '@/components/ui/badge';

const STATUS: Record<ClipStatus, { text: string; tone: 'neutral' | 'info' | 'good' | 'bad' }> = {
  uploaded: { text: 'Uploaded', tone: 'info' },
  processing: { text: 'Processing', tone: 'info' },
  ready: { text: 'Ready', tone: 'good' },
  failed: { text: 'Failed', tone: 'bad' },
};

export function ClipStatusBadge({ status }: { status: ClipStatus }) {
  const s = STATUS[status];
  return <Badge tone={s.tone}>{s.text}</Badge>;
}
