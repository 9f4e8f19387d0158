import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import mysql from 'mysql2/promise';
import supertest from 'supertest';
import { inject } from 'vitest';
import type {} from './mariadb-global';
import type { Role } from '../../shared/api/auth';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import type { AppDeps } from '../../server/deps';
import { createDb, type Db } from '../../server/db/client';
import { runMigrations } from '../../server/db/migrate';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { smtpMailer } from '../../server/mail/mailer';
import { diskStorage } from '../../server/storage';
import { settleRateLimitWrites } from '../../server/auth/rate-limit-store';
import { DEMO_PASSWORD, seedDemo, seedShop, type DemoSeed, type SeededShop, type ShopSpec } from '../../seeds/index';

export type TestAgent = ReturnType<typeof supertest.agent>;

export interface TestContextOptions {
  /** 'accounts' (default): the demo shop's four people only; 'full': the whole demo seed. */
  demo?: 'accounts' | 'full';
  /** Config overrides (PUBLIC_URL, …). */
  config?: Partial<Config>;
}

export interface TestContext {
  app: Express;
  deps: AppDeps;
  db: Db;
  /** supertest on the app, no cookies kept. */
  request: ReturnType<typeof supertest>;
  /** A cookie-keeping agent signed in as the demo shop's person of that role (cached per role). */
  agent(role: Role): Promise<TestAgent>;
  /** The same in the second shop ("Birch Hollow Hydraulics", other-<role>@example.net). */
  otherShopAgent(role: Role): Promise<TestAgent>;
  /** A new agent signed in with these credentials (fails the test if sign-in does not answer 200). */
  signIn(email: string, password?: string): Promise<TestAgent>;
  demo: DemoSeed;
  otherShop: SeededShop;
  /** The in-process fake SMTP server; `mail.messages` are parsed (subject, to, text, html, attachments). */
  mail: FakeSmtp;
  /** Origin header value the app accepts as its own. */
  origin: string;
  close(): Promise<void>;
}

export const otherShopSpec: ShopSpec = {
  name: 'Birch Hollow Hydraulics',
  people: [
    { role: 'owner', name: 'Lena Marsh', email: 'other-owner@example.net' },
    { role: 'lead', name: 'Tomas Brandt', email: 'other-lead@example.net' },
    { role: 'tech', name: 'Ada Quill', email: 'other-tech@example.net' },
    { role: 'writer', name: 'Rui Nakamura', email: 'other-writer@example.net' },
  ],
};

/**
 * A fresh database (random name) on the run's private MariaDB, migrated and seeded, the
 * app over it with a cheap argon2 cost, and a fake SMTP server. Call in beforeAll, close in afterAll.
 */
export async function createTestContext(options: TestContextOptions = {}): Promise<TestContext> {
  const rootUrl = inject('mariadbRootUrl');
  const name = `wwtest_${randomBytes(6).toString('hex')}`;
  const admin = await mysql.createConnection({ uri: rootUrl });
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.end();
  const url = new URL(rootUrl);
  url.pathname = `/${name}`;

  const config = loadConfig(
    { NODE_ENV: 'test' },
    { argon2: { memoryCost: 1024, timeCost: 1 }, publicUrl: 'http://127.0.0.1:3999', ...options.config },
  );
  const { db, pool } = createDb(url.toString(), { connectionLimit: 5 });
  await runMigrations(db);
  const mail = await startFakeSmtp(db);
  const mailer = smtpMailer({ host: mail.host, port: mail.port, secure: false, ignoreTLS: true }, config.mailFrom);
  const storageDir = mkdtempSync(path.join(os.tmpdir(), 'wirewalk-test-files-'));
  const deps: AppDeps = { db, pool, config, mailer, storage: diskStorage(storageDir), outbox: true, demo: true };
  const demo = await seedDemo(deps, { demo: options.demo ?? 'accounts' });
  const otherShop = await seedShop(deps, otherShopSpec);
  const app = createApp(deps);

  const signIn = async (email: string, password = DEMO_PASSWORD) => {
    const agent = supertest.agent(app);
    const res = await agent.post('/api/auth/sign-in').send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
    return agent;
  };
  const cache = new Map<string, Promise<TestAgent>>();
  const cached = (key: string, email: string) => {
    let agent = cache.get(key);
    if (!agent) {
      agent = signIn(email);
      cache.set(key, agent);
    }
    return agent;
  };

  return {
    app,
    deps,
    db,
    request: supertest(app),
    agent: (role) => cached(`demo:${role}`, demo.users[role].email),
    otherShopAgent: (role) => cached(`other:${role}`, otherShop.users[role].email),
    signIn,
    demo,
    otherShop,
    mail,
    origin: config.publicUrl,
    async close() {
      await mailer.close();
      await mail.close();
      await settleRateLimitWrites();
      await pool.end();
      const admin2 = await mysql.createConnection({ uri: rootUrl });
      await admin2.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await admin2.end();
      rmSync(storageDir, { recursive: true, force: true });
    },
  };
}
