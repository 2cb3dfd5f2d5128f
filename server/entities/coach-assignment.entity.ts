import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, uuidColumn } from './columns';

/** A coach coaches an age group; their reach is the athletes of those groups. */
export interface CoachAssignment {
  id: string;
  coachUserId: string;
  ageGroupId: string;
}

export const CoachAssignmentEntity = new EntitySchema<CoachAssignment>({
  name: 'CoachAssignment',
  tableName: 'coach_assignment',
  columns: {
    id: idColumn,
    coachUserId: uuidColumn,
    ageGroupId: uuidColumn,
  },
  foreignKeys: [
    foreignKey('User', 'coachUserId', 'CASCADE'),
    foreignKey('AgeGroup', 'ageGroupId', 'CASCADE'),
  ],
  uniques: [{ name: 'UQ_coach_assignment_pair', columns: ['coachUserId', 'ageGroupId'] }],
});
