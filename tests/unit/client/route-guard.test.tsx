// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { buildRoutes } from '../../../src/App';
import { safeReturnPath } from '../../../src/features/auth';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const chief = {
  user: { id: 1, email: 'chief@sigmaline.test', name: 'Ilse Marrow', isAdmin: false },
  memberships: [{ cruiseId: 5, role: 'chief_scientist' }],
};

function renderAt(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(buildRoutes(queryClient), { initialEntries: [path] });
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

describe('route guard', () => {
  let signedIn = false;

  beforeEach(() => {
    signedIn = false;
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        const method = init?.method ?? 'GET';
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        if (url === '/api/auth/me') {
          return signedIn
            ? json(200, chief)
            : json(401, { error: { code: 'unauthenticated', message: 'Sign in', details: [] } });
        }
        if (url === '/api/auth/login' && method === 'POST') {
          signedIn = true;
          return json(200, { user: chief.user });
        }
        if (url === '/api/cruises') return json(200, []);
        return json(404, { error: { code: 'not_found', message: 'Not found', details: [] } });
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('sends a signed-out visitor to /signin and keeps the path they asked for', async () => {
    const router = renderAt('/cruises/5/team?tab=invites');
    await screen.findByRole('form', { name: 'Sign in' });
    expect(router.state.location.pathname).toBe('/signin');
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe('/cruises/5/team?tab=invites');
  });

  it('returns to the kept path after signing in', async () => {
    const router = renderAt('/admin/mail');
    await screen.findByRole('form', { name: 'Sign in' });
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'chief@sigmaline.test' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'sigmaline-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/admin/mail'));
    // The chief scientist is not a site admin: the mail page says so instead of listing mail.
    expect(await screen.findByRole('heading', { name: 'Mail is for site admins' })).toBeTruthy();
  });

  it('lets a signed-in user straight through', async () => {
    signedIn = true;
    const router = renderAt('/');
    expect(await screen.findByRole('heading', { name: 'Cruises', level: 1 })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/');
  });

  it('does not guard the signed-out pages', async () => {
    const router = renderAt('/reset');
    expect(await screen.findByRole('form', { name: 'Request a password reset' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/reset');
  });

  it('accepts only same-site return paths', () => {
    expect(safeReturnPath('/cruises/5')).toBe('/cruises/5');
    expect(safeReturnPath('//evil.example/x')).toBe('/');
    expect(safeReturnPath('https://evil.example')).toBe('/');
    expect(safeReturnPath('/\\evil.example')).toBe('/');
    expect(safeReturnPath(null)).toBe('/');
  });
});
