import type { ReactNode } from 'react';
import { Brand } from './Brand';
import { Footer } from './Footer';

/** The frame of the signed-out pages: a narrow sheet on the paper, the caution below. */
export function AuthFrame({ title, children, aside }: { title: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-paper-rule">
        <div className="mx-auto flex h-12 max-w-[1840px] items-center px-6">
          <Brand />
        </div>
      </header>
      <main className="flex flex-1 items-start justify-center px-6 pt-[10vh] pb-12">
        <div className="w-full max-w-[26rem]">
          <div className="border border-paper-rule bg-paper-raised">
            <h1 className="border-b border-paper-rule px-6 py-3 text-lg font-semibold text-ink-strong">{title}</h1>
            <div className="px-6 py-5">{children}</div>
          </div>
          {aside && <div className="mt-4 text-sm text-ink-soft">{aside}</div>}
        </div>
      </main>
      <Footer />
    </div>
  );
}
