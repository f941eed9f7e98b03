import { Outlet } from 'react-router-dom';
import { Footer } from '../components/Footer';
import { TopBar } from '../components/TopBar';
import { SessionGate } from '../features/auth';

/** The frame of everything behind sign-in: top bar, the screen, the caution. */
export default function SignedInLayout() {
  return (
    <SessionGate>
      <div className="flex min-h-screen flex-col">
        <TopBar />
        <main className="mx-auto w-full max-w-[1840px] flex-1 px-6 py-6">
          <Outlet />
        </main>
        <Footer />
      </div>
    </SessionGate>
  );
}
