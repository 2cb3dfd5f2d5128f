import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClubMemberListResponse } from '@shared/schemas/club.schema';
import { api } from '@/lib/api-client';
import { clubKeys } from './club-keys';

export function getMembers(): Promise<ClubMemberListResponse> {
  return api.get<ClubMemberListResponse>('/api/club/members');
}

export const membersQueryOptions = () => queryOptions({ queryKey: clubKeys.members(), queryFn: getMembers });

export function useMembers() {
  return useQuery(membersQueryOptions());
}
