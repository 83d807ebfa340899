import type { ReactNode } from 'react';
import { Brand } from '../brand';

/** The frame of the signed-out pages: the name at the top, one card in the middle. */
export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="px-6 py-4">
        <Brand />
      </header>
      <main id="main" className="flex flex-1 items-start justify-center px-4 pt-6 pb-16 sm:pt-12">
        <div className="w-full max-w-md rounded-lg border-2 border-line bg-surface p-6 shadow-raised sm:p-8">
          <h1 className="mb-6 text-xl font-bold">
            {title}
          </h1>
          {children}
        </div>
      </main>
    </div>
  );
}
