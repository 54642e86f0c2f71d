// @vitest-environment jsdom
/**
 * An address the app has no page for, signed in: the app's frame with a "Page not found" page
 * that names the address and leads back to the projects, never the error page.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, test } from 'vitest';
import { appRoutes } from '../../../web/src/app/router';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { testQueryClient } from '../helpers/render';

const DESIGNER = { id: 3, email: 'designer@demo.longtail.test', displayName: 'Priya Valcourt', role: 'designer', createdAt: '2026-03-02T09:30:00.000Z' };

useFetchStub((request) => (request.key === 'GET /api/auth/me' ? json(200, { user: DESIGNER }) : undefined));

describe('an unknown address', () => {
  test('shows "Page not found" with the address and a way back, inside the signed-in frame', async () => {
    const queryClient = testQueryClient();
    const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: ['/proposals/12/no-such-page'] });
    render(
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>,
    );

    const heading = await screen.findByRole('heading', { level: 1, name: 'Page not found' }, { timeout: 5000 });
    expect(heading.closest('[role="alert"]')!.textContent).toContain('/proposals/12/no-such-page');
    expect(screen.queryByText(/Something went wrong/)).toBeNull();
    expect(screen.getByRole('link', { name: 'Back to your projects' }).getAttribute('href')).toBe('/');
    // The frame is there: the main navigation still works from here.
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });
});
