import { Inject, Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import { CLOCK, type Clock } from '../../common/clock/clock';
import type { OutgoingMail } from '../mail.service';
import { MailOutboxEntry } from './mail-outbox.entity';
import { MailRelay } from './mail-relay';

/**
 * The way the app sends e-mail: `enqueue` writes the mail as an outbox row inside the caller's
 * transaction (so the mail exists exactly when the change it reports does); after the commit,
 * `sendSoon` asks the relay to try those rows at once. The relay's periodic sweep picks up
 * whatever is left (mail server down, app restarted).
 */
@Injectable()
export class MailOutbox {
  constructor(
    private readonly relay: MailRelay,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  async enqueue(
    manager: EntityManager,
    mail: OutgoingMail,
    opts: { kind: string; refId?: string | null },
  ): Promise<string> {
    const result = await manager.insert(MailOutboxEntry, {
      kind: opts.kind,
      refId: opts.refId ?? null,
      payload: this.relay.seal(mail),
      attempts: 0,
      nextAttemptAt: this.clock.now(),
    });
    return String((result.identifiers[0] as { id: string | number }).id);
  }

  /** The sealed payload of a mail (enqueue does this; exposed so equal-work paths can too). */
  seal(mail: OutgoingMail): Buffer {
    return this.relay.seal(mail);
  }

  /** After the transaction committed: send these rows now, without waiting for the sweep. */
  sendSoon(ids: string[]): void {
    this.relay.runSoon(ids);
  }
}
