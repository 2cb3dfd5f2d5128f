import type { SessionDto } from '@shared/schemas/session.schema';
import type { TrainingSession } from '../entities/training-session.entity';

export function toSessionDto(session: TrainingSession, clipCount: number): SessionDto {
  return {
    id: session.id,
    date: session.date,
    venue: session.venue,
    discipline: session.discipline,
    snow: session.snow,
    notes: session.notes,
    clipCount,
  };
}
