// @vitest-environment jsdom
/**
 * The spec form's PNP transistor (`device.pnp`): the PTAT source mirrors through PNPs
 * (ENGINE-CONTRACT.md, "New topology: ptat (needs device.pnp)"), so choosing it shows the PNP's
 * section under Device and the form, like the server, refuses the spec until the PNP is given.
 * The PTAT source is not among the default options.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import specSchema from '#shared/schema/spec.schema.json';
import { validateSpec } from '#shared/validate';
import { saveSpecVersion } from '../../../web/src/features/specs/api/spec-queries';
import { SpecForm, type SpecDraft } from '../../../web/src/features/specs/components/spec-form';
import { mockFetch } from './fetch-mock';

const SAVED: SpecDraft = { title: 'Fen gauge input', supply: { positiveV: 9, negativeV: -9 }, gain: { target: 36, tolerancePercent: 2 }, cmrr: { minDb: 66 } };
const PTAT_OPTION = /^PTAT \(constant-gm\) source — needs a PNP transistor$/;

let network: ReturnType<typeof mockFetch> | undefined;
afterEach(() => {
  cleanup();
  network?.assertNoUnexpectedRequests();
  vi.unstubAllGlobals();
});

function renderForm(initial: SpecDraft = SAVED, readOnly = false) {
  network = mockFetch({
    'GET /api/schema/spec': { status: 200, body: specSchema },
    'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
    'PUT /api/specs/7': { status: 200, body: {} },
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const onSave = vi.fn((draft: SpecDraft) => saveSpecVersion(7, { title: String(draft.title ?? ''), payload: draft }));
  render(
    <QueryClientProvider client={queryClient}>
      <SpecForm initial={initial} onSave={readOnly ? undefined : onSave} saveLabel="Save as new version" />
    </QueryClientProvider>,
  );
  return { onSave, puts: () => network!.requests.filter((r) => r.key === 'PUT /api/specs/7') };
}

const pnpSection = () => screen.queryByRole('region', { name: 'PNP transistor' });

/** The text of the elements an element's aria-describedby names. */
function description(element: HTMLElement): string {
  return (element.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');
}

describe('the spec form’s PNP transistor', () => {
  test('when the default options are kept, then the PTAT source is offered unchecked, saying it needs a PNP, and there is no PNP section', async () => {
    renderForm();
    const ptat = await screen.findByRole('checkbox', { name: PTAT_OPTION });
    expect((ptat as HTMLInputElement).checked).toBe(false);
    expect(screen.getByText(/choosing it asks for the PNP under Device/)).toBeTruthy();
    expect(pnpSection()).toBeNull();
  });

  test('when the PTAT source is chosen without a PNP, then its section appears and the form says beside it what is missing, and sends nothing', async () => {
    const { puts } = renderForm();
    await userEvent.click(await screen.findByRole('checkbox', { name: PTAT_OPTION }));
    const section = await screen.findByRole('region', { name: 'PNP transistor' });
    expect(section.textContent).toContain('PTAT (constant-gm) source mirrors its current through PNP transistors (Q7, Q8)');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    // The message sits right under the section, in the field's own place
    const message = await screen.findByText(/is required: the tail options include the PTAT \(constant-gm\) source, whose mirror is PNP/);
    expect(section.parentElement!.contains(message)).toBe(true);
    expect(puts()).toHaveLength(0);
  });

  test('when the PNP’s values are typed, then the spec is saved with them in SI and the PTAT source among its options', async () => {
    const { puts } = renderForm();
    await userEvent.click(await screen.findByRole('checkbox', { name: PTAT_OPTION }));
    await userEvent.type(await screen.findByLabelText(/^PNP current gain/), '110');
    await userEvent.type(screen.getByLabelText(/^PNP Early voltage/), '46 V');
    const saturation = screen.getByLabelText(/^PNP saturation current/);
    await userEvent.type(saturation, '6.3f');
    expect(description(saturation)).toMatch(/= 6\.3 fA/);
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = (puts()[0].body as { payload: { device: { pnp: Record<string, number> }; topologies: string[] } }).payload;
    expect(payload.topologies).toContain('ptat');
    expect(payload.device.pnp.beta).toBe(110);
    expect(payload.device.pnp.earlyVoltageV).toBe(46);
    expect(payload.device.pnp.saturationCurrentA).toBeCloseTo(6.3e-15, 27);
  });

  test('when the PTAT source is chosen and then left out again, the empty PNP section goes and the spec saves without a PNP', async () => {
    const { puts } = renderForm();
    const ptat = await screen.findByRole('checkbox', { name: PTAT_OPTION });
    await userEvent.click(ptat);
    await screen.findByRole('region', { name: 'PNP transistor' });
    await userEvent.click(ptat);
    await waitFor(() => expect(pnpSection()).toBeNull());
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = (puts()[0].body as { payload: { device?: { pnp?: unknown }; topologies: string[] } }).payload;
    expect(payload.topologies).not.toContain('ptat');
    expect(payload.device?.pnp).toBeUndefined();
  });

  test('when a saved spec with the PTAT source is shown read-only, then the PNP section shows its values', async () => {
    renderForm({ ...SAVED, device: { pnp: { beta: 110, earlyVoltageV: 46, saturationCurrentA: 6.3e-15 } }, topologies: ['widlar', 'ptat'] }, true);
    await screen.findByRole('region', { name: 'PNP transistor' });
    expect((screen.getByLabelText(/^PNP current gain/) as HTMLInputElement).value).toBe('110 A/A');
    expect((screen.getByLabelText(/^PNP saturation current/) as HTMLInputElement).value).toBe('6.3 fA');
  });
});

describe('the spec form’s device family', () => {
  const family = (name: RegExp) => within(screen.getByRole('group', { name: /^Device family/ })).getByRole('radio', { name });
  const PTAT_FOR_PNP = /^PTAT \(constant-gm\) source — needs an NPN pair$/;
  /** What the server answers for a PNP spec with the PTAT source among its options (its own validation, run here). */
  const serverRefusal = () => {
    const checked = validateSpec({ ...SAVED, device: { family: 'pnp' }, topologies: ['widlar', 'ptat'] });
    if (checked.ok) throw new Error('the server takes a PNP spec with the PTAT source');
    const issue = checked.errors.find((e) => e.path === '/topologies')!;
    return issue.message;
  };

  test('when an NPN spec is edited, then the family is a choice of NPN and PNP bipolar, NPN chosen', async () => {
    renderForm();
    await screen.findByRole('group', { name: /^Device family/ });
    expect((family(/^NPN bipolar$/) as HTMLInputElement).checked).toBe(true);
    expect((family(/^PNP bipolar$/) as HTMLInputElement).checked).toBe(false);
  });

  test('when PNP is chosen, then the PTAT source is offered disabled, with the server’s reason under the options, and the spec saves as a PNP one', async () => {
    const { puts } = renderForm();
    await screen.findByRole('group', { name: /^Device family/ });
    expect((screen.getByRole('checkbox', { name: PTAT_OPTION }) as HTMLInputElement).disabled).toBe(false);
    await userEvent.click(family(/^PNP bipolar$/));
    const ptat = await screen.findByRole('checkbox', { name: PTAT_FOR_PNP });
    expect((ptat as HTMLInputElement).disabled).toBe(true);
    // The server's words after "the tail options include"
    const reason = serverRefusal().replace(/^the tail options include /, '');
    expect(screen.getByText((text) => text.includes(reason))).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = (puts()[0].body as { payload: { device: { family: string }; topologies?: string[] } }).payload;
    expect(payload.device.family).toBe('pnp');
    expect(payload.topologies ?? []).not.toContain('ptat');
  });

  test('when PNP is chosen with the PTAT source among the options, then the form refuses it at once in the server’s words, sends nothing, and takes the spec once it is left out', async () => {
    const { puts } = renderForm({ ...SAVED, device: { pnp: { beta: 110, earlyVoltageV: 46 } }, topologies: ['widlar', 'ptat'] });
    await screen.findByRole('region', { name: 'PNP transistor' });
    await userEvent.click(family(/^PNP bipolar$/));
    const message = await screen.findByText(serverRefusal());
    const ptat = screen.getByRole('checkbox', { name: PTAT_FOR_PNP }) as HTMLInputElement;
    expect(ptat.checked).toBe(true);
    expect(ptat.disabled).toBe(false);
    expect(screen.getByRole('group', { name: /^Tail options/ }).parentElement!.parentElement!.contains(message)).toBe(true);
    // The PNP of the PTAT tail: not asked for a PNP stage; its values stay with the spec, said unused
    expect(pnpSection()!.textContent).toContain('The stage is a PNP one');
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    expect(await screen.findAllByText(serverRefusal())).toHaveLength(1);
    expect(puts()).toHaveLength(0);
    await userEvent.click(ptat);
    await waitFor(() => expect(screen.queryByText(serverRefusal())).toBeNull());
    expect(ptat.disabled).toBe(true);
    await userEvent.click(screen.getByRole('button', { name: 'Save as new version' }));
    await waitFor(() => expect(puts()).toHaveLength(1));
    const payload = (puts()[0].body as { payload: { device: { family: string }; topologies: string[] } }).payload;
    expect(payload.device.family).toBe('pnp');
    expect(payload.topologies).toEqual(['widlar']);
  });

  test('when a PNP spec is shown read-only, then the family reads PNP bipolar', async () => {
    renderForm({ ...SAVED, device: { family: 'pnp' } }, true);
    expect(await screen.findByText('PNP bipolar')).toBeTruthy();
    expect(screen.queryByText('NPN bipolar')).toBeNull();
  });
});
