import { Notice } from '@/components/ui/notice';

export function FilmingCaution() {
  return (
    <Notice tone="caution" title="Filming on the hill">
      Stand where uphill skiers can see you, never below a blind roll or inside the course. Follow the
      area&apos;s rules and your club&apos;s safety policy.
    </Notice>
  );
}
