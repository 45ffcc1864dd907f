import { ApiProperty } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsInt,
  IsString,
  Length,
  Matches,
  Max,
  Min,
  ValidateNested,
} from 'class-validator';
import type { BookingRules, OpeningInterval, ShopClosure, ShopSettings } from '@loamline/shared-types';

const TIME = /^(?:[01]\d|2[0-3]):[0-5]\d$|^24:00$/;
const DATE = /^\d{4}-\d{2}-\d{2}$/;

export class OpeningIntervalDto implements OpeningInterval {
  @ApiProperty({ minimum: 1, maximum: 7, description: 'ISO weekday: 1 = Monday … 7 = Sunday' })
  @IsInt()
  @Min(1)
  @Max(7)
  weekday: number;

  @ApiProperty({ example: '09:00', description: 'HH:mm, wall clock in the shop zone, on the 5-minute grid' })
  @Matches(TIME, { message: 'must be a time HH:mm' })
  start: string;

  @ApiProperty({ example: '17:30', description: 'HH:mm, after start; 24:00 allowed' })
  @Matches(TIME, { message: 'must be a time HH:mm' })
  end: string;
}

export class ShopClosureDto implements ShopClosure {
  @ApiProperty({ example: '2027-04-02' })
  @Matches(DATE, { message: 'must be a date YYYY-MM-DD' })
  from: string;

  @ApiProperty({ example: '2027-04-05' })
  @Matches(DATE, { message: 'must be a date YYYY-MM-DD' })
  to: string;

  @ApiProperty({ example: 'Holiday' })
  @IsString()
  @Length(1, 200)
  reason: string;
}

export class BookingRulesDto implements BookingRules {
  @ApiProperty({ minimum: 5, maximum: 240, example: 30 })
  @IsInt()
  @Min(5)
  @Max(240)
  slotStepMinutes: number;

  @ApiProperty({ minimum: 0, maximum: 20160, example: 720 })
  @IsInt()
  @Min(0)
  @Max(20160)
  minNoticeMinutes: number;

  @ApiProperty({ minimum: 1, maximum: 365, example: 60 })
  @IsInt()
  @Min(1)
  @Max(365)
  maxDaysAhead: number;

  @ApiProperty({ minimum: 5, maximum: 120, example: 15 })
  @IsInt()
  @Min(5)
  @Max(120)
  holdMinutes: number;

  @ApiProperty({ minimum: 0, maximum: 720, example: 48 })
  @IsInt()
  @Min(0)
  @Max(720)
  cancellationWindowHours: number;
}

/** `PUT /api/workshop/settings`: the whole settings, replaced at once. */
export class ShopSettingsDto implements ShopSettings {
  @ApiProperty({ example: 'Europe/Berlin', description: 'an IANA time-zone name' })
  @IsString()
  @Length(1, 64)
  timeZone: string;

  @ApiProperty({ example: 'EUR', description: 'ISO 4217' })
  @Matches(/^[A-Z]{3}$/, { message: 'must be a three-letter currency code' })
  currency: string;

  @ApiProperty({ minimum: 1, maximum: 20 })
  @IsInt()
  @Min(1)
  @Max(20)
  benches: number;

  @ApiProperty({ type: [OpeningIntervalDto] })
  @IsArray()
  @ArrayMaxSize(70)
  @ValidateNested({ each: true })
  @Type(() => OpeningIntervalDto)
  hours: OpeningIntervalDto[];

  @ApiProperty({ type: [ShopClosureDto] })
  @IsArray()
  @ArrayMaxSize(200)
  @ValidateNested({ each: true })
  @Type(() => ShopClosureDto)
  closures: ShopClosureDto[];

  @ApiProperty({ type: BookingRulesDto })
  @ValidateNested()
  @Type(() => BookingRulesDto)
  rules: BookingRulesDto;
}
