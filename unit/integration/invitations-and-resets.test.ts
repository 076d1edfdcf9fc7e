/**
 * Invitations and password resets end to end through the real database and the fake SMTP server:
 * the e-mail arrives, its link works once, stale or malformed input is refused with a clear
 * message and changes nothing.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { clearInbox, linkFrom, listInbox, waitForMail } from '@/unit/helpers/maildev';
import { closeDb, getDb } from '@/db/client';
import { demoAccounts, seedDemoWorkspace } from '@/db/seed';
import { authorizeCredentials, wrongCredentialsMessage } from '@/features/auth/authorize';
import { linkMessages, passwordResetRequestedMessage } from '@/features/auth/account-messages';
import { hashToken } from '@/lib/auth/tokens';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));
vi.mock('next/cache', () => ({ revalidatePath: () => undefined }));
const client = vi.hoisted(() => ({ ip: '10.9.0.1' }));
vi.mock('next/headers', () => ({ headers: async () => new Headers({ 'x-forwarded-for': client.ip }) }));

const { inviteMemberAction } = await import('@/app/(app)/members/actions');
const { acceptInvitationAction, requestPasswordResetAction, resetPasswordAction } = await import('@/app/(auth)/actions');

const appUrl = process.env.APP_URL!;
let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
});
beforeEach(async () => {
  await clearInbox();
  await rawQuery('DELETE FROM sign_in_counters');
  session.current = { userId: seeded.userIds.admin, workspaceId: seeded.workspaceId };
  client.ip = '10.9.0.1';
});
afterAll(closeDb);

const form = (fields: Record<string, string>) => {
  const data = new FormData();
  for (const [name, value] of Object.entries(fields)) data.set(name, value);
  return data;
};
const tableCounts = async () => {
  const [row] = await rawQuery<Record<string, number>>(
    `SELECT (SELECT COUNT(*) FROM users) AS users, (SELECT COUNT(*) FROM memberships) AS memberships,
            (SELECT COUNT(*) FROM invitations) AS invitations, (SELECT COUNT(*) FROM password_reset_tokens) AS resets,
            (SELECT COUNT(*) FROM audit_events) AS audit`,
  );
  return Object.fromEntries(Object.entries(row).map(([k, v]) => [k, Number(v)]));
};
const tokenOf = (link: string) => link.split('/').pop()!;

describe('invitation', () => {
  it('e-mails a one-time link that creates the account, which then signs in', async () => {
    const before = await tableCounts();
    const state = await inviteMemberAction({ status: 'idle' }, form({ email: 'Nia.New@Larkspur.example', role: 'reviewer' }));
    expect(state).toEqual({ status: 'success', message: 'Invitation sent to nia.new@larkspur.example as Reviewer.' });

    const mail = await waitForMail('nia.new@larkspur.example');
    expect(mail.subject).toBe('You are invited to Larkspur Biosignals on Channelsmith');
    const link = linkFrom(mail, `${appUrl}/invite/`);
    const token = tokenOf(link);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes in base64url

    // Only the hash is stored, with a 72-hour expiry.
    const [row] = await rawQuery<{ token_hash: string; role: string; expires_at: Date; created_at: Date }>(
      'SELECT token_hash, role, expires_at, created_at FROM invitations WHERE email = ?',
      ['nia.new@larkspur.example'],
    );
    expect(row.token_hash).toBe(hashToken(token));
    expect(row.token_hash).not.toContain(token);
    const lifetimeH = (row.expires_at.getTime() - row.created_at.getTime()) / 3_600_000;
    expect(lifetimeH).toBeCloseTo(72, 2);

    const accepted = await acceptInvitationAction(
      { status: 'idle' },
      form({ token, name: 'Nia Newcombe', password: 'nia-password-1', confirmPassword: 'nia-password-1' }),
    );
    expect(accepted).toEqual({
      status: 'success',
      message: 'Your account for nia.new@larkspur.example is ready. Sign in with your new password.',
    });
    await expect(
      authorizeCredentials({ email: 'nia.new@larkspur.example', password: 'nia-password-1' }, { ip: '10.9.0.1' }),
    ).resolves.toMatchObject({ name: 'Nia Newcombe', role: 'reviewer', workspaceId: seeded.workspaceId });

    const after = await tableCounts();
    expect(after).toEqual({ ...before, users: before.users + 1, memberships: before.memberships + 1, invitations: before.invitations + 1, audit: before.audit + 3 });
    const actions = await rawQuery<{ action: string }>('SELECT action FROM audit_events ORDER BY id DESC LIMIT 3');
    expect(actions.map((a) => a.action).sort()).toEqual(['invitation.accepted', 'invitation.created', 'membership.created']);

    // The same link again: refused, nothing changes.
    const reused = await acceptInvitationAction(
      { status: 'idle' },
      form({ token, name: 'Someone Else', password: 'other-password-1', confirmPassword: 'other-password-1' }),
    );
    expect(reused).toMatchObject({ status: 'error', message: linkMessages.invitation.used });
    expect(await tableCounts()).toEqual(after);
  });

  it('refuses an expired link with a clear message and changes nothing', async () => {
    await inviteMemberAction({ status: 'idle' }, form({ email: 'late.comer@larkspur.example', role: 'engineer' }));
    const token = tokenOf(linkFrom(await waitForMail('late.comer@larkspur.example'), `${appUrl}/invite/`));
    // Age the invitation past its expiry (invitations are ordinary rows; only audit rows are frozen).
    await rawQuery('UPDATE invitations SET expires_at = ? WHERE token_hash = ?', [new Date(Date.now() - 1000), hashToken(token)]);
    const before = await tableCounts();
    const state = await acceptInvitationAction(
      { status: 'idle' },
      form({ token, name: 'Late Comer', password: 'late-password-1', confirmPassword: 'late-password-1' }),
    );
    expect(state).toMatchObject({ status: 'error', message: 'This invitation has expired. Ask an admin of the workspace to invite you again.' });
    expect(await tableCounts()).toEqual(before);
  });

  it('refuses an unknown token', async () => {
    const state = await acceptInvitationAction(
      { status: 'idle' },
      form({ token: 'x'.repeat(43), name: 'Nobody', password: 'nobody-password', confirmPassword: 'nobody-password' }),
    );
    expect(state).toMatchObject({ status: 'error', message: linkMessages.invitation['not-found'] });
  });

  it('refuses malformed and over-long input naming the field and the reason, sending nothing', async () => {
    const before = await tableCounts();
    const cases: Array<[Record<string, string>, Record<string, string[]>]> = [
      [{ email: 'not-an-address', role: 'engineer' }, { email: ['E-mail must be a valid address, like name@example.com'] }],
      [{ email: `${'a'.repeat(250)}@x.example`, role: 'engineer' }, { email: ['E-mail must be at most 254 characters'] }],
      [{ email: '', role: 'engineer' }, { email: ['E-mail is required'] }],
      [{ email: 'ok@larkspur.example', role: 'owner' }, { role: ['Role must be admin, engineer, reviewer or regulator'] }],
      [{ email: demoAccounts[1].email, role: 'engineer' }, { email: [`${demoAccounts[1].email} is already a member of this workspace`] }],
    ];
    for (const [fields, fieldErrors] of cases) {
      const state = await inviteMemberAction({ status: 'idle' }, form(fields));
      expect(state, JSON.stringify(fields).slice(0, 80)).toMatchObject({ status: 'error', fieldErrors });
    }
    expect(await tableCounts()).toEqual(before);
    expect(await listInbox()).toEqual([]);
  });

  it('refuses an over-long name, a short password and mismatched passwords without using the link', async () => {
    await inviteMemberAction({ status: 'idle' }, form({ email: 'careful@larkspur.example', role: 'engineer' }));
    const token = tokenOf(linkFrom(await waitForMail('careful@larkspur.example'), `${appUrl}/invite/`));
    const before = await tableCounts();
    const cases: Array<[Record<string, string>, Record<string, string[]>]> = [
      [{ name: 'N'.repeat(121), password: 'long-enough-1', confirmPassword: 'long-enough-1' }, { name: ['Name must be at most 120 characters'] }],
      [{ name: 'Cara', password: 'short', confirmPassword: 'short' }, { password: ['Password must be at least 10 characters'] }],
      [{ name: 'Cara', password: 'p'.repeat(73), confirmPassword: 'p'.repeat(73) }, { password: ['Password must be at most 72 bytes'] }],
      [{ name: 'Cara', password: 'long-enough-1', confirmPassword: 'long-enough-2' }, { confirmPassword: ['Passwords do not match'] }],
    ];
    for (const [fields, fieldErrors] of cases) {
      const state = await acceptInvitationAction({ status: 'idle' }, form({ token, ...fields }));
      expect(state).toMatchObject({ status: 'error', fieldErrors });
    }
    expect(await tableCounts()).toEqual(before);
    // The link still works afterwards.
    const ok = await acceptInvitationAction(
      { status: 'idle' },
      form({ token, name: 'Cara Careful', password: 'long-enough-1', confirmPassword: 'long-enough-1' }),
    );
    expect(ok.status).toBe('success');
  });
});

describe('password reset', () => {
  const rhea = demoAccounts[2];

  it('gives the same neutral answer for an unknown e-mail and sends nothing, storing nothing', async () => {
    const before = await tableCounts();
    const state = await requestPasswordResetAction({ status: 'idle' }, form({ email: 'stranger@larkspur.example' }));
    expect(state).toEqual({ status: 'success', message: passwordResetRequestedMessage });
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(await listInbox()).toEqual([]);
    expect(await tableCounts()).toEqual(before);
  });

  it('refuses a malformed e-mail naming the field', async () => {
    const state = await requestPasswordResetAction({ status: 'idle' }, form({ email: 'rhea@' }));
    expect(state).toMatchObject({ status: 'error', fieldErrors: { email: ['E-mail must be a valid address, like name@example.com'] } });
  });

  it('e-mails a one-time link that sets a new password; the old one stops working', async () => {
    const state = await requestPasswordResetAction({ status: 'idle' }, form({ email: rhea.email }));
    expect(state).toEqual({ status: 'success', message: passwordResetRequestedMessage });
    const mail = await waitForMail(rhea.email);
    expect(mail.subject).toBe('Reset your Channelsmith password');
    const token = tokenOf(linkFrom(mail, `${appUrl}/reset-password/`));

    const before = await tableCounts();
    const reset = await resetPasswordAction(
      { status: 'idle' },
      form({ token, password: 'rhea-new-password', confirmPassword: 'rhea-new-password' }),
    );
    expect(reset).toEqual({ status: 'success', message: `The password for ${rhea.email} is changed. Sign in with the new one.` });
    expect((await tableCounts()).audit).toBe(before.audit + 1);

    await expect(authorizeCredentials({ email: rhea.email, password: rhea.password }, { ip: '10.8.0.1' })).rejects.toThrow(
      wrongCredentialsMessage,
    );
    await expect(
      authorizeCredentials({ email: rhea.email, password: 'rhea-new-password' }, { ip: '10.8.0.1' }),
    ).resolves.toMatchObject({ role: 'reviewer' });

    const reused = await resetPasswordAction(
      { status: 'idle' },
      form({ token, password: 'another-password', confirmPassword: 'another-password' }),
    );
    expect(reused).toMatchObject({ status: 'error', message: linkMessages.passwordReset.used });
    await expect(
      authorizeCredentials({ email: rhea.email, password: 'rhea-new-password' }, { ip: '10.8.0.1' }),
    ).resolves.toMatchObject({ role: 'reviewer' });
  });

  it('refuses an expired link and leaves the password as it was', async () => {
    const eli = demoAccounts[1];
    await requestPasswordResetAction({ status: 'idle' }, form({ email: eli.email }));
    const token = tokenOf(linkFrom(await waitForMail(eli.email), `${appUrl}/reset-password/`));
    await rawQuery('UPDATE password_reset_tokens SET expires_at = ? WHERE token_hash = ?', [new Date(Date.now() - 1000), hashToken(token)]);
    const state = await resetPasswordAction(
      { status: 'idle' },
      form({ token, password: 'eli-new-password', confirmPassword: 'eli-new-password' }),
    );
    expect(state).toMatchObject({ status: 'error', message: linkMessages.passwordReset.expired });
    await expect(authorizeCredentials({ email: eli.email, password: eli.password }, { ip: '10.8.0.2' })).resolves.toMatchObject({
      role: 'engineer',
    });
  });

  it('sends at most 3 reset e-mails per address in 15 minutes; the 4th is refused, sends and stores nothing', async () => {
    const ada = demoAccounts[0];
    for (let i = 0; i < 3; i++) {
      client.ip = `10.9.1.${i + 1}`;
      expect(await requestPasswordResetAction({ status: 'idle' }, form({ email: ada.email }))).toEqual({ status: 'success', message: passwordResetRequestedMessage });
    }
    await waitForMail(ada.email);
    const before = await tableCounts();
    const sent = (await listInbox()).length;
    expect(before.resets).toBeGreaterThanOrEqual(3);
    client.ip = '10.9.1.9';
    const refused = await requestPasswordResetAction({ status: 'idle' }, form({ email: ` ${ada.email.toUpperCase()} ` }));
    expect(refused).toEqual({ status: 'error', message: 'Too many attempts; try again in 15 minutes: no reset e-mail was sent.', fieldErrors: {}, values: { email: ` ${ada.email.toUpperCase()} ` } });
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect((await listInbox()).length).toBe(sent);
    expect(await tableCounts()).toEqual(before);
    // Unknown addresses are counted the same way, so the refusal says nothing about who has an account.
    for (let i = 0; i < 3; i++) await requestPasswordResetAction({ status: 'idle' }, form({ email: 'nobody@larkspur.example' }));
    expect(await requestPasswordResetAction({ status: 'idle' }, form({ email: 'nobody@larkspur.example' }))).toMatchObject({ status: 'error', message: refused.status === 'error' ? refused.message : '' });
  });

  it('sends at most 20 reset e-mails from one client address in 15 minutes', async () => {
    client.ip = '10.9.2.1';
    for (let i = 0; i < 20; i++) {
      expect(await requestPasswordResetAction({ status: 'idle' }, form({ email: `someone-${i}@larkspur.example` }))).toMatchObject({ status: 'success' });
    }
    expect(await requestPasswordResetAction({ status: 'idle' }, form({ email: 'someone-20@larkspur.example' }))).toMatchObject({ status: 'error', message: expect.stringMatching(/^Too many attempts; try again in 1[45] minutes/) });
    client.ip = '10.9.2.2';
    expect(await requestPasswordResetAction({ status: 'idle' }, form({ email: 'someone-20@larkspur.example' }))).toMatchObject({ status: 'success' });
  });
});
