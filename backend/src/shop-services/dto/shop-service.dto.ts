import { ApiProperty, PartialType } from '@nestjs/swagger';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsInt,
  IsOptional,
  IsString,
  Length,
  Max,
  MaxLength,
  Min,
} from 'class-validator';
import { REPORT_LIMITS } from '@loamline/shared-types';

/** `POST /api/workshop/services` (owner) */
export class CreateShopServiceDto {
  @ApiProperty({ example: 'Air spring setup — fork and shock' })
  @IsString()
  @Length(1, 120)
  name: string;

  @ApiProperty({ example: 'Air let out, chambers set for your weight, sag checked.', required: false })
  @IsOptional()
  @IsString()
  @MaxLength(1000)
  description?: string;

  @ApiProperty({ minimum: 5, maximum: 600, example: 60, description: 'minutes, on the 5-minute grid' })
  @IsInt()
  @Min(5)
  @Max(600)
  durationMinutes: number;

  @ApiProperty({ minimum: 0, maximum: 240, example: 15, description: 'bench time kept after, minutes' })
  @IsInt()
  @Min(0)
  @Max(240)
  bufferAfterMinutes: number;

  @ApiProperty({ minimum: 0, maximum: 10_000_000, example: 8900, description: 'minor units; 0 = free' })
  @IsInt()
  @Min(0)
  @Max(10_000_000)
  priceMinor: number;

  @ApiProperty({ minimum: 0, example: 2000, description: 'charged at booking, at most the price' })
  @IsInt()
  @Min(0)
  @Max(10_000_000)
  depositMinor: number;

  @ApiProperty({ required: false, default: true })
  @IsOptional()
  @IsBoolean()
  active?: boolean;

  @ApiProperty({
    required: false,
    nullable: true,
    type: [String],
    maxItems: REPORT_LIMITS.checklistItems,
    example: ['Dust wipers and foam rings replaced', 'Sag measured on the bike'],
    description:
      "the work this service includes, the service report's checklist; null: Loamline's default list",
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(REPORT_LIMITS.checklistItems)
  @IsString({ each: true })
  @Length(1, REPORT_LIMITS.checklistLabelChars, { each: true })
  checklist?: string[] | null;
}

/** `PATCH /api/workshop/services/:id` (owner): any of the fields */
export class UpdateShopServiceDto extends PartialType(CreateShopServiceDto) {}
