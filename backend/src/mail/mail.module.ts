import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailService } from './mail.service';
import { MailOutboxEntry } from './outbox/mail-outbox.entity';
import { MailOutbox } from './outbox/mail-outbox';
import { MailRelay } from './outbox/mail-relay';

/** SMTP (MailService) and the outbox every mail goes through (MailOutbox, MailRelay). */
@Module({
  imports: [TypeOrmModule.forFeature([MailOutboxEntry])],
  providers: [MailService, MailRelay, MailOutbox],
  exports: [MailOutbox, MailRelay],
})
export class MailModule {}
