import type { ReactNode } from 'react';

/** The frame of the pages outside the app: sign-in, invitation, password reset. */
export function AuthCard({ title, titleId, children }: { title: string; titleId: string; children: ReactNode }) {
  return (
    <div className="flex min-h-full items-center justify-center bg-ink-900 bg-[radial-gradient(circle_at_20%_0%,#2a5a68_0,transparent_55%)] px-4 py-12">
      <main id="main" aria-labelledby={titleId} className="w-full max-w-md space-y-6">
        <div className="flex items-center justify-center gap-3 text-ink-50">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <span className="text-2xl font-semibold tracking-wide">Headroom</span>
        </div>
        <div className="space-y-5 rounded-2xl bg-white p-8 shadow-xl">
          <h1 id={titleId} className="text-xl font-semibold text-ink-900">
            {title}
          </h1>
          {children}
        </div>
        <p className="text-center text-xs text-ink-300">
          Current traces, inrush events and circuit headroom, in one place.
        </p>
      </main>
    </div>
  );
}
