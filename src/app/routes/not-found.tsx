import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { paths } from '@/config/paths';

export function NotFoundPage() {
  return (
    <EmptyState
      title="This page does not exist"
      action={<ButtonLink to={paths.home.href()}>Go to your start page</ButtonLink>}
    >
      The link may be old or mistyped.
    </EmptyState>
  );
}
