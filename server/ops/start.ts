// `npm start`: PostgreSQL up, migrations applied, demo seeded, client built when stale, then serve.
import path from 'node:path';
import { projectRoot, readConfig } from '../config';
import { createLogger } from '../logger';
import { serve } from '../main';
import { buildClient, isClientBuildStale } from './client-build';
import { demoCompetitions, seedDemoScenario } from './demo-scenario';
import { demoPassword, demoUsers } from './demo-users';
import { startLocalPostgres, type LocalPostgres } from './postgres';
import { roleLabels, type RoleAssignment } from '../../shared/auth/roles';

const competitionNames = new Map<string, string>(demoCompetitions.map((c) => [c.id, c.name]));

/** "Official (start) at Frostbarrow Night Sprint, Glimmerdale Junior Cup": one line per role, the races after it. */
function describeRoles(roles: readonly RoleAssignment[]): string {
  const where = new Map<string, string[]>();
  for (const r of roles) {
    const role = `${roleLabels[r.role]}${r.area ? ` (${r.area})` : ''}`;
    where.set(role, [...(where.get(role) ?? []), r.competitionId ? (competitionNames.get(r.competitionId) ?? r.competitionId) : 'all competitions']);
  }
  return [...where].map(([role, places]) => `${role} at ${places.join(', ')}`).join('; ');
}

const say = (line: string) => console.log(`[rimelog] ${line}`);

async function main(): Promise<void> {
  const config = readConfig();
  const logger = createLogger(process.env['LOG_LEVEL'] ?? 'warn');
  const cleanups: (() => Promise<void>)[] = [];
  let stopping = false;
  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    say('Stopping...');
    for (const cleanup of cleanups.reverse()) {
      await cleanup().catch((error: unknown) => console.error(error));
    }
    process.exit(code);
  };
  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));

  try {
    let databaseUrl = config.databaseUrl;
    if (databaseUrl) {
      say('Using the PostgreSQL server named by DATABASE_URL.');
    } else {
      const postgres: LocalPostgres = await startLocalPostgres({
        dataDir: path.join(config.dataDir, 'pg'),
        port: config.postgresPort,
        log: say,
      });
      cleanups.push(() => postgres.stop());
      databaseUrl = postgres.url;
    }

    if (isClientBuildStale(projectRoot, config.clientDir)) {
      say('Building the app (it is missing or older than its sources)...');
      await buildClient(projectRoot);
    }

    const running = await serve(config, databaseUrl, logger);
    cleanups.push(() => running.close());
    const seeded = await seedDemoScenario(running.database.db);
    say(seeded > 0 ? `Demo scenario seeded (${seeded} competitions).` : 'Demo scenario already present.');

    say(`Rimelog is running at ${running.url}`);
    say(`E-mail goes to ${running.mailDestination}.`);
    say(`Demo sign-ins (password for all: ${demoPassword}):`);
    for (const user of demoUsers) say(`  ${user.email.padEnd(36)} ${describeRoles(user.roles)}`);
    say(`Press Ctrl-C to stop the server${config.smtpUrl ? '' : ', the fake mail server'} and PostgreSQL.`);
  } catch (error) {
    console.error(`[rimelog] Could not start: ${error instanceof Error ? error.message : String(error)}`);
    await stopAll(1);
  }
}

void main();
