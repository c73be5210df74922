// The transactional outbox: mail is written as rows in the caller's transaction and sent later by
// the worker (lib/mail/worker.ts), so a state change and its e-mails commit or fail together.
import type { DbOrTx } from "@/db";
import { mailOutbox } from "@/db/schema";
import type { MailMessage } from "./templates";

export async function enqueueMail(db: DbOrTx, message: MailMessage): Promise<void> {
  await db.insert(mailOutbox).values({
    toAddress: message.to,
    subject: message.subject,
    textBody: message.text,
    htmlBody: message.html,
  });
}
