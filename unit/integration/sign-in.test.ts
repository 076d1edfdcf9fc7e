import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { demoAccounts, seedDemoWorkspace } from '@/db/seed';
import { authorizeCredentials, wrongCredentialsMessage } from '@/features/auth/authorize';

const admin = demoAccounts[0];
const engineer = demoAccounts[1];
let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;

beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
});
beforeEach(async () => {
  // Counters are plain rows (no trigger), so each test starts from none.
  await rawQuery('DELETE FROM sign_in_counters');
});
afterAll(closeDb);

describe('credentials sign-in', () => {
  it('signs in with the right password and carries user, workspace and role', async () => {
    const user = await authorizeCredentials({ email: 'ADA.Admin@larkspur.example ', password: admin.password }, { ip: '10.0.0.1' });
    expect(user).toMatchObject({
      userId: seeded.userIds.admin,
      email: admin.email,
      name: admin.name,
      workspaceId: seeded.workspaceId,
      role: 'admin',
    });
  });

  it('refuses a wrong password and an unknown e-mail with the same message', async () => {
    await expect(authorizeCredentials({ email: admin.email, password: 'not-the-password' }, { ip: '10.0.0.2' })).rejects.toThrow(
      'E-mail or password is incorrect',
    );
    await expect(
      authorizeCredentials({ email: 'nobody@larkspur.example', password: admin.password }, { ip: '10.0.0.2' }),
    ).rejects.toThrow(wrongCredentialsMessage);
  });

  it('refuses malformed input with a message naming the field', async () => {
    await expect(authorizeCredentials({ email: 'not-an-address', password: 'x' }, { ip: '10.0.0.3' })).rejects.toThrow(
      'E-mail must be a valid address, like name@example.com',
    );
    await expect(authorizeCredentials({ email: admin.email, password: '' }, { ip: '10.0.0.3' })).rejects.toThrow(
      'Password is required',
    );
    await expect(authorizeCredentials(undefined, { ip: '10.0.0.3' })).rejects.toThrow('E-mail is required');
  });
});

describe('sign-in rate limit (counters in MariaDB)', () => {
  it('refuses the account after 5 failures, even with the right password, and stores the count', async () => {
    const t0 = new Date('2030-01-01T09:00:00Z');
    for (let i = 0; i < 5; i += 1) {
      await expect(
        authorizeCredentials({ email: engineer.email, password: 'guess-' + i }, { ip: `10.1.0.${i}`, now: t0 }),
      ).rejects.toThrow(wrongCredentialsMessage);
    }
    const rows = await rawQuery<{ key: string; failures: number }>(
      "SELECT `key`, failures FROM sign_in_counters WHERE `key` LIKE 'account:%'",
    );
    expect(rows).toEqual([{ key: `account:${engineer.email}`, failures: 5 }]);

    // One minute later: 14 of the 15 minutes remain.
    const t1 = new Date(t0.getTime() + 60_000);
    await expect(
      authorizeCredentials({ email: engineer.email, password: engineer.password }, { ip: '10.1.1.1', now: t1 }),
    ).rejects.toThrow('Too many attempts; try again in 14 minutes');

    // After the window the right password works again and the account counter is cleared.
    const t2 = new Date(t0.getTime() + 15 * 60_000 + 1);
    await expect(
      authorizeCredentials({ email: engineer.email, password: engineer.password }, { ip: '10.1.1.1', now: t2 }),
    ).resolves.toMatchObject({ role: 'engineer' });
    expect(await rawQuery("SELECT * FROM sign_in_counters WHERE `key` LIKE 'account:%'")).toEqual([]);
  });

  it('limits an unknown e-mail the same way, so limits reveal no accounts', async () => {
    const now = new Date('2030-01-02T09:00:00Z');
    for (let i = 0; i < 5; i += 1) {
      await expect(
        authorizeCredentials({ email: 'ghost@larkspur.example', password: 'x' }, { ip: `10.2.0.${i}`, now }),
      ).rejects.toThrow(wrongCredentialsMessage);
    }
    await expect(
      authorizeCredentials({ email: 'ghost@larkspur.example', password: 'x' }, { ip: '10.2.1.1', now }),
    ).rejects.toThrow('Too many attempts; try again in 15 minutes');
  });

  it('refuses one address after 20 failures spread over many accounts', async () => {
    const now = new Date('2030-01-03T09:00:00Z');
    for (let i = 0; i < 20; i += 1) {
      await expect(
        authorizeCredentials({ email: `spray-${i}@larkspur.example`, password: 'x' }, { ip: '192.0.2.7', now }),
      ).rejects.toThrow(wrongCredentialsMessage);
    }
    const [ipRow] = await rawQuery<{ failures: number }>("SELECT failures FROM sign_in_counters WHERE `key` = 'ip:192.0.2.7'");
    expect(ipRow.failures).toBe(20);
    await expect(
      authorizeCredentials({ email: admin.email, password: admin.password }, { ip: '192.0.2.7', now }),
    ).rejects.toThrow(/^Too many attempts; try again in 15 minutes$/);
    // Another address is not affected.
    await expect(
      authorizeCredentials({ email: admin.email, password: admin.password }, { ip: '192.0.2.8', now }),
    ).resolves.toMatchObject({ role: 'admin' });
  });

  it('starts a new window once the old one has passed', async () => {
    const t0 = new Date('2030-01-04T09:00:00Z');
    for (let i = 0; i < 4; i += 1) {
      await expect(authorizeCredentials({ email: admin.email, password: 'x' }, { ip: '10.3.0.1', now: t0 })).rejects.toThrow();
    }
    const later = new Date(t0.getTime() + 16 * 60_000);
    await expect(authorizeCredentials({ email: admin.email, password: 'x' }, { ip: '10.3.0.1', now: later })).rejects.toThrow(
      wrongCredentialsMessage,
    );
    const [row] = await rawQuery<{ failures: number; started: Date }>(
      'SELECT failures, window_started_at AS started FROM sign_in_counters WHERE `key` = ?',
      [`account:${admin.email}`],
    );
    expect(row.failures).toBe(1);
    expect(row.started.toISOString()).toBe(later.toISOString());
  });
});
