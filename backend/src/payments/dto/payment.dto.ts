import { Transform } from 'class-transformer';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsInt, IsOptional, IsString, IsUUID, Length, Matches, Max, Min } from 'class-validator';
import type { RefundRequest } from '@loamline/shared-types';

export class RefundDto implements RefundRequest {
  @ApiProperty({ example: 1500, description: 'minor units; 1 … what is left to refund' })
  @IsInt()
  @Min(1)
  @Max(100_000_000)
  amountMinor: number;

  @ApiProperty({ example: 'Seal kit was not needed after all.' })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @Length(3, 500)
  reason: string;

  @ApiProperty({ format: 'uuid', description: 'made once per refund form: the same id twice refunds once' })
  @IsUUID()
  requestId: string;
}

export class WorkshopPaymentsQueryDto {
  @ApiPropertyOptional({
    example: '2027-03-01',
    description: 'first day, in the shop’s zone (default: 29 days ago)',
  })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  from?: string;

  @ApiPropertyOptional({ example: '2027-03-31', description: 'last day, included (default: today)' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  to?: string;
}
