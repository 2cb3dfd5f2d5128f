import { z } from 'zod';

export const DISCIPLINES = ['free_ski', 'slalom', 'giant_slalom', 'super_g', 'drills'] as const;
export const DISCIPLINE_LABELS: Record<(typeof DISCIPLINES)[number], string> = {
  free_ski: 'Free skiing',
  slalom: 'Slalom',
  giant_slalom: 'Giant slalom',
  super_g: 'Super-G',
  drills: 'Drills',
};
export const SNOW_CONDITIONS = ['hard', 'packed', 'soft', 'icy', 'slush', 'powder'] as const;

/** True for a real day: "2026-02-30" matches the pattern but is not one. */
export function isCalendarDate(text: string): boolean {
  const [y, m, d] = text.split('-').map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d;
}

export const createSessionSchema = z.object({
  date: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-14')
    .refine(isCalendarDate, 'That day does not exist'),
  venue: z.string().trim().min(1, 'Enter the venue').max(120),
  discipline: z.enum(DISCIPLINES),
  snow: z.enum(SNOW_CONDITIONS),
  notes: z.string().trim().max(2000).optional(),
});
export type CreateSessionInput = z.infer<typeof createSessionSchema>;

export interface SessionDto {
  id: string;
  date: string;
  venue: string;
  discipline: (typeof DISCIPLINES)[number];
  snow: (typeof SNOW_CONDITIONS)[number];
  notes: string | null;
  clipCount: number;
}

export interface SessionListResponse {
  sessions: SessionDto[];
}
export interface SessionResponse {
  session: SessionDto;
}
