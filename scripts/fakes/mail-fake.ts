import http from "node:http";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

/**
 * A local SMTP server that keeps every message in memory, with a small inbox page for people
 * and a JSON API for tests. Loopback only; it never relays anything anywhere.
 */

export interface CaughtMail {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escape(title)}</title>
<style>body{font:16px/1.5 system-ui,sans-serif;margin:2rem;color:#14213d;background:#f6f5f2}
table{border-collapse:collapse;width:100%}td,th{padding:.5rem;border-bottom:1px solid #c3c0b6;text-align:left}
iframe{width:100%;height:70vh;border:1px solid #c3c0b6;background:#fff}pre{white-space:pre-wrap;background:#fff;padding:1rem}</style>
</head><body>${body}</body></html>`;
}

export function startMailFake(options: { smtpPort: number; httpPort: number; host?: string }) {
  const host = options.host ?? "127.0.0.1";
  const messages: CaughtMail[] = [];
  let nextId = 1;

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
          messages.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
            to,
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : "",
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  smtp.listen(options.smtpPort, host);

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", `http://${host}`);
    const send = (status: number, type: string, body: string) => {
      res.writeHead(status, { "Content-Type": type, "Cache-Control": "no-store" });
      res.end(body);
    };
    if (url.pathname === "/api/messages" && req.method === "GET") {
      const to = url.searchParams.get("to")?.toLowerCase();
      const list = to ? messages.filter((m) => m.to.includes(to)) : messages;
      return send(200, "application/json", JSON.stringify(list));
    }
    if (url.pathname === "/api/messages" && req.method === "DELETE") {
      messages.length = 0;
      return send(200, "application/json", JSON.stringify({ cleared: true }));
    }
    const one = /^\/messages\/(\d+)$/.exec(url.pathname);
    if (one) {
      const m = messages.find((x) => x.id === Number(one[1]));
      if (!m) return send(404, "text/html", page("Not found", "<p>No such message.</p>"));
      const body = m.html
        ? `<iframe sandbox="" srcdoc="${escape(m.html)}" title="message"></iframe>`
        : `<pre>${escape(m.text)}</pre>`;
      return send(
        200,
        "text/html",
        page(
          m.subject,
          `<p><a href="/">All messages</a></p><h1>${escape(m.subject)}</h1>
<p>From ${escape(m.from)} to ${escape(m.to.join(", "))}, ${escape(m.receivedAt)}</p>${body}
<h2>Text part</h2><pre>${escape(m.text)}</pre>`,
        ),
      );
    }
    if (url.pathname === "/") {
      const rows = [...messages]
        .reverse()
        .map(
          (m) => `<tr><td>${escape(m.receivedAt)}</td><td>${escape(m.to.join(", "))}</td>
<td><a href="/messages/${m.id}">${escape(m.subject || "(no subject)")}</a></td></tr>`,
        )
        .join("");
      return send(
        200,
        "text/html",
        page(
          "Local mail inbox",
          `<h1>Local mail inbox</h1><p>Every e-mail the local Tautline sends lands here; nothing leaves this machine.</p>
${rows ? `<table><tr><th>Received</th><th>To</th><th>Subject</th></tr>${rows}</table>` : "<p>No messages yet.</p>"}`,
        ),
      );
    }
    return send(404, "text/plain", "not found");
  });
  web.listen(options.httpPort, host);

  return {
    messages,
    close: () =>
      Promise.all([new Promise<void>((r) => smtp.close(() => r())), new Promise<void>((r) => web.close(() => r()))]),
  };
}
