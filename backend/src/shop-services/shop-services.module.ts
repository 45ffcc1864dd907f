import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { ShopSettingsModule } from '../shop-settings/shop-settings.module';
import { ShopServiceEntity } from './shop-service.entity';
import { ShopServicesService } from './shop-services.service';
import { WorkshopServicesController } from './workshop-services.controller';

/** What a shop offers, for how long and at what price. */
@Module({
  imports: [TypeOrmModule.forFeature([ShopServiceEntity, AppointmentEntity]), ShopSettingsModule],
  controllers: [WorkshopServicesController],
  providers: [ShopServicesService],
  exports: [ShopServicesService],
})
export class ShopServicesModule {}
