import { z } from 'zod';

export const ROLES = ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'] as const;
export type Role = (typeof ROLES)[number];

export const loginSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid email address'),
  password: z.string().min(1, 'Enter your password'),
});
export type LoginInput = z.infer<typeof loginSchema>;

/** POST /api/auth/logout; `everywhere` also ends the member's other sessions and access tokens. */
export const logoutSchema = z.object({ everywhere: z.boolean().optional() });
export type LogoutInput = z.infer<typeof logoutSchema>;

export const acceptInvitationSchema = z.object({
  token: z.string().min(10),
  name: z.string().trim().min(1, 'Enter your name').max(120),
  password: z.string().min(10, 'Use at least 10 characters').max(200),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

/** A new password: the length here; whether it is too easy to guess is the server's check. */
const newPasswordField = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(200, 'Use at most 200 characters');

/** POST /api/auth/password: the signed-in member changes their password. */
export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password'),
  newPassword: newPasswordField,
});
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

/** POST /api/auth/password-reset: asks for a reset link by e-mail. */
export const passwordResetRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid email address'),
});
export type PasswordResetRequestInput = z.infer<typeof passwordResetRequestSchema>;

/** POST /api/auth/password-reset/:token: sets the new password from the e-mailed link. */
export const passwordResetCompleteSchema = z.object({ password: newPasswordField });
export type PasswordResetCompleteInput = z.infer<typeof passwordResetCompleteSchema>;

/** GET /api/auth/password-reset/:token: whose password the link resets. */
export interface PasswordResetInfo {
  email: string;
}

export const createInvitationSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter a valid email address'),
  role: z.enum(ROLES),
  /** For athlete invitations: the athlete record to link. For guardians: the child. */
  athleteId: z.string().uuid().optional(),
  /** For coach invitations: the age groups they will coach. */
  ageGroupIds: z.array(z.string().uuid()).optional(),
});
export type CreateInvitationInput = z.infer<typeof createInvitationSchema>;

export interface UserDto {
  id: string;
  email: string;
  name: string;
  role: Role;
  clubId: string;
  /** Set for the athlete role: the athlete record this user is. */
  athleteId: string | null;
  /** Set for the guardian role: the athletes this user is guardian of. */
  childAthleteIds: string[];
  /** Set for the coach role: the age groups they coach. */
  coachedAgeGroupIds: string[];
}

export interface LoginResponse {
  accessToken: string;
  user: UserDto;
}

export interface MeResponse {
  user: UserDto;
  club: { id: string; name: string };
}

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  athleteId: string | null;
  ageGroupIds: string[];
  expiresAt: string;
  createdAt: string;
}

export interface InvitationResponse {
  invitation: InvitationDto;
}

/** What the public invitation page shows before the new member sets a password. */
export interface InvitationPreviewResponse {
  invitation: {
    email: string;
    role: Role;
    club: { id: string; name: string };
    athleteName: string | null;
    expiresAt: string;
  };
}
