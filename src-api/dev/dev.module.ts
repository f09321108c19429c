import { Controller, Get, Inject, Module } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';
import { CONFIG, type AppConfig } from '../config';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { ApiResult } from '../common/openapi';

export const mailboxMessageSchema = z.object({
  id: z.number(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});

/**
 * The captured-mail listing for the demo and the tests. This module is only loaded when mail
 * goes to the local capture server and never in production mode.
 */
@ApiTags('dev')
@Controller('dev')
export class DevController {
  constructor(@Inject(CONFIG) private readonly cfg: AppConfig) {}

  @Get('mailbox')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'Messages captured by the local SMTP capture server (demo and tests only)' })
  @ApiResult(z.object({ items: z.array(mailboxMessageSchema) }))
  async mailbox(): Promise<{ items: z.infer<typeof mailboxMessageSchema>[] }> {
    const res = await fetch(`${this.cfg.MAIL_CAPTURE_URL}/messages`);
    const items = (await res.json()) as z.infer<typeof mailboxMessageSchema>[];
    return { items: items.reverse() };
  }
}

@Module({ controllers: [DevController] })
export class DevModule {}
