import type { ReactNode } from 'react';

interface EmptyStateProps {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
}

export function EmptyState({ title, children, action }: EmptyStateProps) {
  return (
    <div className="rounded-lg border border-dashed border-granite-200 bg-white px-6 py-10 text-center">
      <p className="font-medium text-granite-800">{title}</p>
      {children ? <div className="mx-auto mt-1 max-w-prose text-sm text-granite-600">{children}</div> : null}
      {action ? <div className="mt-4 flex justify-center">{action}</div> : null}
    </div>
  );
}
