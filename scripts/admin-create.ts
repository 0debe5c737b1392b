import readline from 'node:readline';
import { parseArgs } from 'node:util';
import { createUserBody } from '../shared/schemas/auth';
import { config, passwordPepper } from '../server/config';
import { createDb, migrateLatest } from '../server/db/knex';
import { systemClock } from '../server/lib/clock';
import { AppError } from '../server/lib/errors';
import { createUsersService } from '../server/modules/users/users.service';

/**
 * `npm run admin:create -- --email ADDRESS --name "NAME"`: a site admin
 * account on DATABASE_URL, which is how the first one is made (the server
 * makes no accounts unless SEED_DEMO=true asks for the demo). The password
 * is asked for twice at a terminal, without showing it, or read from the
 * first line of standard input when that is not a terminal. It passes the
 * same rules as every new password (server/lib/passwords.ts) and is hashed
 * with the server's pepper (PASSWORD_PEPPER, or the one under DATA_DIR), so
 * run this with the server's DATABASE_URL and DATA_DIR.
 */
const USAGE = 'Usage: npm run admin:create -- --email ADDRESS --name "YOUR NAME"   (the password is asked for, or read from standard input)';

function fail(message: string, code = 1): never {
  console.error(message);
  process.exit(code);
}

function ask(rl: readline.Interface, prompt: string): Promise<string> {
  return new Promise((resolve) => rl.question(prompt, resolve));
}

/** Reads a password: twice at a terminal with nothing echoed, else the first line of standard input. */
async function readPassword(): Promise<string> {
  if (!process.stdin.isTTY) {
    const rl = readline.createInterface({ input: process.stdin });
    for await (const line of rl) {
      rl.close();
      return line;
    }
    return '';
  }
  const rl = readline.createInterface({ input: process.stdin, output: process.stdout, terminal: true });
  let muted = false;
  const write = (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput.bind(rl);
  (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput = (s) => write(muted && !s.startsWith('\r\n') && s !== '\n' ? '' : s);
  const twice = async (prompt: string) => {
    process.stdout.write(prompt);
    muted = true;
    const answer = await ask(rl, '');
    muted = false;
    process.stdout.write('\n');
    return answer;
  };
  const first = await twice('Password (12 to 128 characters; not shown): ');
  const again = await twice('The same password again: ');
  rl.close();
  if (first !== again) fail('password: the two passwords differ. Nothing was made.');
  return first;
}

let args: { email?: string; name?: string };
try {
  args = parseArgs({ options: { email: { type: 'string' }, name: { type: 'string' } }, strict: true }).values;
} catch (err) {
  fail(`${(err as Error).message}\n${USAGE}`, 2);
}
if (!args.email || !args.name) fail(USAGE, 2);

const password = await readPassword();
const body = createUserBody.safeParse({ email: args.email, name: args.name, password, isSiteAdmin: true });
if (!body.success) fail(body.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('\n') + '\nNothing was made.');

const db = createDb(config.databaseUrl);
try {
  await migrateLatest(db);
  const users = createUsersService(db, systemClock, { publicUrl: config.publicUrl, pepper: passwordPepper() });
  // The owner typed the password here, so it is theirs: no change is asked for at the first sign-in.
  const user = await users.create(body.data, null);
  console.log(`Made site admin ${user.email} (${user.name}). Sign in at ${config.publicUrl}/sign-in.`);
} catch (err) {
  if (!(err instanceof AppError)) throw err;
  const details = Array.isArray(err.details) ? (err.details as { path: string; message: string }[]) : [];
  process.exitCode = 1;
  console.error(`${details.length > 0 ? details.map((d) => `${d.path}: ${d.message}`).join('\n') : err.message}\nNothing was made.`);
} finally {
  await db.destroy();
}
