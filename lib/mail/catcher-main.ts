import { startMailCatcher } from './catcher';

/** Entry point run by the start and test scripts: `tsx lib/mail/catcher-main.ts`. */
const port = Number(process.env.MAIL_CATCHER_PORT ?? 2525);
const dir = process.env.MAIL_CATCHER_DIR ?? '.data/dev/mail';

startMailCatcher({ port, dir }).then(
  () => console.log(`[mail] catching mail on smtp://127.0.0.1:${port} into ${dir}`),
  (e: Error) => {
    console.error(`[mail] could not start: ${e.message}`);
    process.exit(1);
  },
);
