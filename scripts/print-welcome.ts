import { DEMO_PASSWORD, demoPeople } from "../database/demo-data";

const app = process.env.APP_URL ?? "http://127.0.0.1:3000";
const mail = process.env.MAIL_CATCHER_URL ?? "http://127.0.0.1:1080";
console.log(`
Runproof is starting at ${app}
Mail catcher (every message the app sends): ${mail}

Demo sign-ins (password for all: ${DEMO_PASSWORD})
${demoPeople.map((p) => `  ${p.key.padEnd(10)} ${p.email.padEnd(34)} ${p.name}`).join("\n")}

Press Ctrl-C to stop.
`);
