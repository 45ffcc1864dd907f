import { Module } from '@nestjs/common';
import { BaselinesController } from './baselines.controller';
import { BaselinesService } from './baselines.service';

/** The public compute and sag-check routes; exports BaselinesService for the baseline sheets. */
@Module({ controllers: [BaselinesController], providers: [BaselinesService], exports: [BaselinesService] })
export class BaselinesModule {}
