// `npm run worker`: build the worker (plain JavaScript, see build.mjs) and run one worker process in
// the foreground. Reads .env.local like npm start, so on this machine it finds the local MariaDB and
// Redis; on another machine set REDIS_URL and TAUFORGE_DB_HOST/PORT/NAME/USER/PASSWORD instead.
import { spawn } from 'node:child_process';
import { loadEnv, root } from '../lib/env.mjs';
import { buildWorker } from './build.mjs';

loadEnv();
const { main } = await buildWorker();
const child = spawn(process.execPath, [main], { cwd: root, stdio: 'inherit', env: process.env });
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill('SIGTERM'));
child.on('exit', (code) => process.exit(code ?? 0));
