import { Global, Module } from '@nestjs/common';
import { SupplierDeskController } from './supplier-desk.controller';
import { SupplierNoticesService } from './supplier-notices.service';

/** Global so Drift watch can inject SupplierNoticesService to announce a die due for service. */
@Global()
@Module({
  controllers: [SupplierDeskController],
  providers: [SupplierNoticesService],
  exports: [SupplierNoticesService],
})
export class SupplierDeskModule {}
