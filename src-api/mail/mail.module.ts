import { Global, Module } from '@nestjs/common';
import { OutboxService } from './outbox.service';
import { OutboxWorker } from './outbox.worker';
import { MailController } from './mail.controller';

/** The outbox and its delivery worker, available to every feature that sends mail. */
@Global()
@Module({
  controllers: [MailController],
  providers: [OutboxService, OutboxWorker],
  exports: [OutboxService, OutboxWorker],
})
export class MailModule {}
