// Local stand-ins for the hosted services, started by scripts/stack.mjs:
//   - s3rver: a real S3 API on loopback, one bucket with the CORS rule browsers need for presigned form uploads;
//   - a mail catcher: a real SMTP server (smtp-server + mailparser) that keeps every message and
//     lists them as JSON on a loopback HTTP port for the admin's dev mailbox page and the tests.
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import S3rver from "s3rver";
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import type { CaughtMail } from "../lib/mail/caught-mail";

function required(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set`);
  return value;
}

const s3Url = new URL(required("S3_ENDPOINT"));
const bucket = required("S3_BUCKET");
const s3Dir = required("S3_DIR");
const appUrl = required("APP_URL");
const smtpPort = Number(required("SMTP_PORT"));
const mailHttpPort = Number(required("MAIL_CATCHER_HTTP_PORT"));

const cors = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>${appUrl}</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>POST</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

fs.mkdirSync(s3Dir, { recursive: true });
const s3 = new S3rver({
  address: "127.0.0.1",
  port: Number(s3Url.port),
  directory: s3Dir,
  silent: true,
  configureBuckets: [{ name: bucket, configs: [cors] }],
});

const mailFile = path.join(path.dirname(s3Dir), "mailbox.json");
const messages: CaughtMail[] = fs.existsSync(mailFile)
  ? (JSON.parse(fs.readFileSync(mailFile, "utf8")) as CaughtMail[])
  : [];
let nextId = messages.length + 1;

// The bundled certificate of smtp-server has expired; the local catcher speaks plain SMTP only.
const smtp = new SMTPServer({
  disabledCommands: ["STARTTLS", "AUTH"],
  authOptional: true,
  logger: false,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((parsed) => {
        const to = session.envelope.rcptTo.map((r) => r.address);
        messages.push({
          id: String(nextId++),
          receivedAt: new Date().toISOString(),
          from: parsed.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
          to,
          subject: parsed.subject ?? "",
          text: parsed.text ?? "",
          html: typeof parsed.html === "string" ? parsed.html : null,
        });
        fs.writeFileSync(mailFile, JSON.stringify(messages));
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});

const mailHttp = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", "http://127.0.0.1");
  if (url.pathname === "/messages" && req.method === "GET") {
    const to = url.searchParams.get("to");
    const list = to ? messages.filter((m) => m.to.includes(to)) : messages;
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify([...list].reverse()));
    return;
  }
  if (url.pathname === "/messages" && req.method === "DELETE") {
    messages.length = 0;
    fs.writeFileSync(mailFile, "[]");
    res.writeHead(204).end();
    return;
  }
  res.writeHead(404, { "content-type": "application/json" }).end('{"error":"not found"}');
});

await s3.run();
await new Promise<void>((resolve) => smtp.listen(smtpPort, "127.0.0.1", resolve));
await new Promise<void>((resolve) => mailHttp.listen(mailHttpPort, "127.0.0.1", resolve));
process.stdout.write(`[ordwise] s3rver on ${s3Url.origin} (bucket ${bucket}); SMTP catcher on 127.0.0.1:${smtpPort}\n`);

function stop() {
  mailHttp.close();
  smtp.close(() => undefined);
  void s3.close().finally(() => process.exit(0));
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
