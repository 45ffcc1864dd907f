import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { ScheduleModule } from '@nestjs/schedule';
import { CoreModule } from './database/core.module';
import { HealthModule } from './health/health.module';
import { AuthModule } from './auth/auth.module';
import { ShopsModule } from './shops/shops.module';
import { BikesModule } from './bikes/bikes.module';
import { BaselineSheetsModule } from './baseline-sheets/baseline-sheets.module';
import { BaselinesModule } from './baselines/baselines.module';
import { RequestOriginGuard } from './common/security/request-origin.guard';
import { AppointmentsModule } from './appointments/appointments.module';
import { PaymentsModule } from './payments/payments.module';
import { ServiceReportsModule } from './service-reports/service-reports.module';
import { ClockModule } from './common/clock/clock';
import { ShopServicesModule } from './shop-services/shop-services.module';
import { ShopSettingsModule } from './shop-settings/shop-settings.module';
import { SpringFitsModule } from './spring-fits/spring-fits.module';

@Module({
  imports: [
    CoreModule,
    ClockModule,
    ScheduleModule.forRoot(),
    HealthModule,
    AuthModule,
    ShopsModule,
    BikesModule,
    BaselineSheetsModule,
    BaselinesModule,
    ShopSettingsModule,
    ShopServicesModule,
    AppointmentsModule,
    PaymentsModule,
    ServiceReportsModule,
    SpringFitsModule,
  ],
  // First of the global guards: JSON only and same origin for every state-changing route.
  providers: [{ provide: APP_GUARD, useClass: RequestOriginGuard }],
})
export class AppModule {}
