// Starts the local mail fake and upload fake on loopback and keeps them up until stopped.
import path from "node:path";
import { env } from "@/lib/env";
import { startMailFake } from "./fakes/mail-fake";
import { startUploadFake } from "./fakes/upload-fake";

const inboxPort = Number(new URL(env.MAIL_INBOX_URL).port);
const s3Port = Number(new URL(env.S3_ENDPOINT).port);
const directory = process.env.TAUTLINE_S3_DIR ?? path.resolve(".data/s3");

const mail = startMailFake({ smtpPort: env.SMTP_PORT, httpPort: inboxPort });
const uploads = await startUploadFake({
  port: s3Port,
  directory,
  bucket: env.S3_BUCKET,
  appOrigin: new URL(env.APP_URL).origin,
});
console.log(`mail fake: SMTP 127.0.0.1:${env.SMTP_PORT}, inbox ${env.MAIL_INBOX_URL}`);
console.log(`upload fake: ${env.S3_ENDPOINT} (bucket ${env.S3_BUCKET}, files in ${directory})`);

const stop = async () => {
  await Promise.allSettled([mail.close(), uploads.close()]);
  process.exit(0);
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
