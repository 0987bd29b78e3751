import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";
import { models } from "@/lib/db";

/**
 * A local SMTP catcher for demo mode and tests: accepts every message on
 * 127.0.0.1 and stores it for the outbox page. Never started in production mode.
 */
export function startMailCatcher(port: number): Promise<SMTPServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    banner: "Heatpath local mail catcher",
    size: 1_048_576,
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = session.envelope.rcptTo.map((r) => r.address);
          const messageId = parsed.messageId ?? null;
          // The link to the queue row decides whose outbox shows it; mail nobody queued links to nothing.
          const row = messageId ? await models().MailMessage.findOne({ where: { messageId }, attributes: ["id"] }) : null;
          await models().CaughtMail.create({
            envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            envelopeTo: to.length ? to : addresses(parsed.to),
            subject: parsed.subject ?? "(no subject)",
            text: parsed.text ?? "",
            messageId,
            receivedAt: new Date(),
            mailMessageId: row?.id ?? null,
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve(server));
  });
}

function addresses(to: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(to) ? to : to ? [to] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? "")).filter(Boolean);
}
