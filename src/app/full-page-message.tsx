import type { ReactNode } from 'react';

/** A quiet centred message for the moments before a page can show anything else. */
export function FullPageMessage({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="flex min-h-0 flex-1 items-center justify-center p-6">
      <div className="max-w-md space-y-2 text-center">
        <h1 className="text-base font-semibold">{title}</h1>
        {children}
      </div>
    </div>
  );
}
