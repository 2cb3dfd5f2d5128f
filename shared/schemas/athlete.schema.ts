import { z } from 'zod';

const currentYear = new Date().getUTCFullYear();

export const createAthleteSchema = z.object({
  firstName: z.string().trim().min(1, 'Enter a first name').max(80),
  lastName: z.string().trim().min(1, 'Enter a last name').max(80),
  birthYear: z.coerce
    .number()
    .int()
    .min(currentYear - 90, 'Check the birth year')
    .max(currentYear - 4, 'Check the birth year'),
  ageGroupId: z.string().uuid('Choose an age group'),
});
export type CreateAthleteInput = z.infer<typeof createAthleteSchema>;

export const recordConsentSchema = z.object({
  guardianName: z.string().trim().min(1, 'Enter the guardian who gave consent').max(120),
  method: z.enum(['signed_form', 'email', 'in_person']),
  /** A second purpose, asked separately: reviews sent to the athlete and guardians by e-mail. */
  shareByEmail: z.boolean().default(false),
});
export type RecordConsentInput = z.infer<typeof recordConsentSchema>;

export const athleteListQuerySchema = z.object({
  search: z.string().trim().max(80).optional(),
  ageGroupId: z.string().uuid().optional(),
});

export interface AgeGroupDto {
  id: string;
  name: string; // "U10", "U12", ...
  minAge: number;
  maxAge: number;
}

export type ConsentStatus = 'granted' | 'missing' | 'not_required' | 'withdrawn';

export interface AthleteConsentDto {
  status: ConsentStatus;
  recordedAt: string | null;
  guardianName: string | null;
  /** Reviews may be sent by e-mail (a guardian's consent for minors; adults decide themselves). */
  shareByEmail: boolean;
  withdrawnAt: string | null;
  /** When clips and reviews of a withdrawn athlete are erased (null once erased, or not withdrawn). */
  erasureDueAt: string | null;
  /** Who decides: a guardian until the athlete turns 18, then the athlete. */
  managedBy: 'guardian' | 'athlete';
}

export interface AthleteDto {
  id: string;
  firstName: string;
  lastName: string;
  birthYear: number;
  ageGroup: AgeGroupDto;
  /** Under-18s need a guardian's recorded consent before clips can be stored. */
  consent: AthleteConsentDto;
  clipCount: number;
}

export interface GuardianDto {
  id: string;
  name: string;
  /** Hidden (null) for analysts: no contact details of minors. */
  email: string | null;
}

export interface AthleteDetailDto extends AthleteDto {
  guardians: GuardianDto[];
}

export interface AthleteListResponse {
  athletes: AthleteDto[];
}
export interface AthleteResponse {
  athlete: AthleteDetailDto;
}
export interface AgeGroupListResponse {
  ageGroups: AgeGroupDto[];
}
