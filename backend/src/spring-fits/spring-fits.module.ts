import { Module } from '@nestjs/common';
import { SpringFitsController } from './spring-fits.controller';
import { SpringFitsService } from './spring-fits.service';

/** The bike's measured spring: fits from an appointment's bench runs, stored on the rider's bike. */
@Module({
  controllers: [SpringFitsController],
  providers: [SpringFitsService],
  exports: [SpringFitsService],
})
export class SpringFitsModule {}
