import { DynamicModule, Module } from '@nestjs/common';
import { APP_FILTER, APP_GUARD, DiscoveryModule } from '@nestjs/core';
import { LoggerModule } from 'nestjs-pino';
import { randomUUID } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import { CONFIG, type AppConfig } from './config';
import { DbModule } from './db/db.module';
import { AuthModule } from './auth/auth.module';
import { UsersModule } from './users/users.module';
import { HealthController } from './health/health.controller';
import { RolesGuard } from './common/roles.guard';
import { ErrorFilter } from './common/error.filter';
import { DevModule } from './dev/dev.module';
import { SuppliersModule } from './suppliers/suppliers.module';
import { PartsModule } from './parts/parts.module';
import { GaugesModule } from './gauges/gauges.module';
import { PlansModule } from './plans/plans.module';
import { StorageModule } from './storage/storage.module';
import { LotsModule } from './lots/lots.module';
import { AuditModule } from './audit/audit.module';
import { LedgerModule } from './ledger/ledger.module';
import { ExportsModule } from './exports/exports.module';
import { SpcModule } from './spc/spc.module';
import { RateLimitModule } from './common/rate-limit';
import { MailModule } from './mail/mail.module';
import { NcrsModule } from './ncrs/ncrs.module';
import { CorrectiveActionsModule } from './corrective-actions/corrective-actions.module';
import { SupplierDeskModule } from './supplier-desk/supplier-desk.module';
import { ScorecardsModule } from './scorecards/scorecards.module';
import { DashboardModule } from './dashboard/dashboard.module';

@Module({})
export class AppModule {
  static forRoot(cfg: AppConfig): DynamicModule {
    return {
      module: AppModule,
      global: true,
      imports: [
        LoggerModule.forRoot({
          pinoHttp: {
            level: cfg.LOG_LEVEL,
            genReqId: (req: IncomingMessage, res) => {
              const given = req.headers['x-request-id'];
              const id = typeof given === 'string' && /^[\w-]{8,64}$/.test(given) ? given : randomUUID();
              res.setHeader('x-request-id', id);
              return id;
            },
            // Never log credentials or session cookies.
            redact: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'req.headers.authorization', 'res.headers["set-cookie"]'],
            autoLogging: { ignore: (req) => req.url === '/api/health' },
          },
        }),
        DiscoveryModule,
        RateLimitModule,
        DbModule,
        AuthModule,
        UsersModule,
        StorageModule,
        SuppliersModule,
        PartsModule,
        GaugesModule,
        PlansModule,
        LotsModule,
        AuditModule,
        LedgerModule,
        ExportsModule,
        SpcModule,
        MailModule,
        NcrsModule,
        CorrectiveActionsModule,
        SupplierDeskModule,
        ScorecardsModule,
        DashboardModule,
        ...(cfg.MAIL_CAPTURE_URL && cfg.NODE_ENV !== 'production' ? [DevModule] : []),
      ],
      controllers: [HealthController],
      providers: [
        { provide: CONFIG, useValue: cfg },
        { provide: APP_GUARD, useClass: RolesGuard },
        { provide: APP_FILTER, useClass: ErrorFilter },
      ],
      exports: [CONFIG],
    };
  }
}
