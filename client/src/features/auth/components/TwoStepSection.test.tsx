import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { renderWithProviders, jsonResponse } from '../../../test/render';
import { setCsrfToken } from '../../../lib/api-client';
import { TwoStepSection } from './TwoStepSection';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('t');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const CODES = [
  'aaaaa-bbbbb',
  'ccccc-ddddd',
  'eeeee-fffff',
  'ggggg-hhhhh',
  'jjjjj-kkkkk',
  'mmmmm-nnnnn',
  'ppppp-qqqqq',
  'rrrrr-sssss',
  'ttttt-vvvvv',
  'wwwww-xxxxx',
];

describe('TwoStepSection', () => {
  it('sets up with a QR code and a typed key, needs a code to switch on, then shows the recovery codes once', async () => {
    let enabled = false;
    fetchMock.mockImplementation(async (input, init) => {
      const url = String(input);
      if (url === '/api/account/two-step')
        return jsonResponse(200, { enabled, enabledAt: enabled ? '2026-12-02T04:00:00.000Z' : null, recoveryCodesLeft: enabled ? 10 : 0 });
      if (url === '/api/account/two-step/setup')
        return jsonResponse(200, {
          secret: 'JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP',
          otpauthUri: 'otpauth://totp/x',
          qrDataUrl: 'data:image/png;base64,AAAA',
        });
      if (url === '/api/account/two-step/enable') {
        const { code } = JSON.parse(init?.body as string);
        if (code !== '246810')
          return jsonResponse(400, {
            error: { code: 'validation_failed', message: 'Check', fields: { code: ['is not the code your app shows now'] } },
            requestId: 'r',
          });
        enabled = true;
        return jsonResponse(200, { recoveryCodes: CODES });
      }
      throw new Error(`unexpected ${url}`);
    });
    renderWithProviders(<TwoStepSection />);
    fireEvent.click(await screen.findByRole('button', { name: 'Set up two-step sign-in' }));
    expect(await screen.findByRole('img', { name: /QR code/ })).toHaveAttribute('src', 'data:image/png;base64,AAAA');
    expect(screen.getByLabelText('Key for typing in by hand')).toHaveValue('JBSWY3DPEHPK3PXPJBSWY3DPEHPK3PXP');

    fireEvent.change(screen.getByLabelText('Code from your app'), { target: { value: '111111' } });
    fireEvent.click(screen.getByRole('button', { name: 'Switch on' }));
    expect(await screen.findByText('Code from your app is not the code your app shows now')).toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('Code from your app'), { target: { value: '246 810' } });
    fireEvent.click(screen.getByRole('button', { name: 'Switch on' }));
    const list = await screen.findByRole('list', { name: 'Recovery codes' });
    expect(
      within(list)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(CODES);

    fireEvent.click(screen.getByRole('button', { name: 'I have saved them' }));
    expect(await screen.findByText(/Recovery codes left/)).toBeInTheDocument();
    expect(screen.queryByRole('list', { name: 'Recovery codes' })).not.toBeInTheDocument();
  });

  it('gives a new set of recovery codes after the password and a code', async () => {
    fetchMock.mockImplementation(async (input, init) => {
      const url = String(input);
      if (url === '/api/account/two-step')
        return jsonResponse(200, { enabled: true, enabledAt: '2026-12-02T04:00:00.000Z', recoveryCodesLeft: 1 });
      if (url === '/api/account/two-step/recovery-codes') {
        expect(JSON.parse(init?.body as string)).toEqual({ password: 'my passphrase', code: '135790' });
        return jsonResponse(200, { recoveryCodes: CODES });
      }
      throw new Error(`unexpected ${url}`);
    });
    renderWithProviders(<TwoStepSection />);
    expect(await screen.findByText(/Few recovery codes are left/)).toBeInTheDocument();
    fireEvent.click(screen.getByRole('button', { name: 'Get new recovery codes…' }));
    const form = screen.getByRole('form', { name: 'Get new recovery codes' });
    fireEvent.change(within(form).getByLabelText('Password'), { target: { value: 'my passphrase' } });
    fireEvent.change(within(form).getByLabelText('Code from your app'), { target: { value: '135790' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Get new codes' }));
    const list = await screen.findByRole('list', { name: 'Recovery codes' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(10);
  });
});
