import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BaselinesModule } from '../baselines/baselines.module';
import { BaselineSheet } from './baseline-sheet.entity';
import { BaselineSheetsController } from './baseline-sheets.controller';
import { BaselineSheetsService } from './baseline-sheets.service';

/** Saved baselines; the computing is BaselinesModule's. */
@Module({
  imports: [TypeOrmModule.forFeature([BaselineSheet]), BaselinesModule],
  controllers: [BaselineSheetsController],
  providers: [BaselineSheetsService],
  exports: [BaselineSheetsService],
})
export class BaselineSheetsModule {}
