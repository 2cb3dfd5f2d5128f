import type { UserDto } from '@shared/schemas/auth.schema';
import { PageHeader } from '@/components/ui/page-header';

const SUBTITLES: Record<UserDto['role'], string> = {
  head_coach: 'Your club at a glance: athletes waiting for consent, recent training days and clips.',
  coach: 'Your athletes and training days.',
  analyst: 'The club’s athletes and sessions, read-only.',
  athlete: 'Your clips from training. Open one to watch it again.',
  guardian: 'Clips of your child from training, read-only.',
};

function subtitleFor(user: UserDto): string {
  if (user.role === 'guardian' && user.childAthleteIds.length > 1) {
    return 'Clips of your children from training, read-only.';
  }
  return SUBTITLES[user.role];
}

export function HomeGreeting({ user, title }: { user: UserDto; title: string }) {
  const first = user.name.split(' ')[0];
  return <PageHeader title={title} subtitle={`Hello ${first}. ${subtitleFor(user)}`} />;
}
