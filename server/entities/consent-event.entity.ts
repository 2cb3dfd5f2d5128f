import { EntitySchema } from 'typeorm';
import type { ConsentAction, ConsentPurpose } from '@shared/schemas/consent.schema';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/**
 * One entry of an athlete's consent record: who gave, withdrew or restored consent, for which purposes,
 * how, who recorded it and when. Goes with the athlete when they are erased.
 */
export interface ConsentEvent {
  id: string;
  athleteId: string;
  action: ConsentAction;
  purposes: ConsentPurpose[];
  /** The person whose decision this is, as stated (a guardian's name, or the adult athlete). */
  decidedBy: string;
  method: 'signed_form' | 'email' | 'in_person' | 'in_app' | null;
  /** The member who recorded it (null once their account is gone). */
  recordedById: string | null;
  recordedByRole: string;
  at: Date;
}

export const ConsentEventEntity = new EntitySchema<ConsentEvent>({
  name: 'ConsentEvent',
  tableName: 'consent_event',
  columns: {
    id: idColumn,
    athleteId: uuidColumn,
    action: { type: 'varchar', length: 20 },
    purposes: { type: 'simple-json' },
    decidedBy: { type: 'varchar', length: 120 },
    method: { type: 'varchar', length: 20, nullable: true },
    recordedById: nullableUuidColumn,
    recordedByRole: { type: 'varchar', length: 12 },
    at: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('User', 'recordedById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_consent_event_athlete', columns: ['athleteId', 'at'] }],
});
