import type { ConsentStatus } from '@shared/schemas/athlete.schema';
import { Badge } from '@/components/ui/badge';

const LABELS: Record<ConsentStatus, { text: string; tone: 'good' | 'warn' | 'neutral' }> = {
  granted: { text: 'Consent recorded', tone: 'good' },
  missing: { text: 'Consent missing', tone: 'warn' },
  not_required: { text: 'Adult, no consent needed', tone: 'neutral' },
  withdrawn: { text: 'Consent withdrawn', tone: 'warn' },
};

export function ConsentBadge({ status }: { status: ConsentStatus }) {
  const label = LABELS[status];
  return <Badge tone={label.tone}>{label.text}</Badge>;
}
