/** Reads the mail catcher's REST API (maildev 3: /api/email). */
export interface CaughtMail {
  id: string;
  subject: string;
  text: string;
  to: Array<{ address: string }>;
}

export async function caughtMail(webUrl: string): Promise<CaughtMail[]> {
  const res = await fetch(`${webUrl}/api/email`);
  if (!res.ok) throw new Error(`maildev answered ${res.status}`);
  return res.json();
}

/** Polls until `predicate` holds for the caught mail, or fails after `timeoutMs`. */
export async function waitForMail(webUrl: string, predicate: (mail: CaughtMail[]) => boolean, timeoutMs = 20_000): Promise<CaughtMail[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const mail = await caughtMail(webUrl);
    if (predicate(mail)) return mail;
    if (Date.now() > until) throw new Error(`mail did not arrive in ${timeoutMs} ms; caught: ${mail.map((m) => m.subject).join(' | ')}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
