import { DISCIPLINE_LABELS, type SessionDto } from '@shared/schemas/session.schema';

export const SNOW_LABELS: Record<SessionDto['snow'], string> = {
  hard: 'Hard',
  packed: 'Packed',
  soft: 'Soft',
  icy: 'Icy',
  slush: 'Slush',
  powder: 'Powder',
};

export function disciplineLabel(discipline: SessionDto['discipline']): string {
  return DISCIPLINE_LABELS[discipline];
}
