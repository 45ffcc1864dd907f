import { ApiProperty } from '@nestjs/swagger';
import type { Bike } from '@loamline/shared-types';
import { ForkDto, ShockDto } from '../../baselines/dto/compute-baseline.dto';

/** OpenAPI shape of a stored bike (the type is shared-types `Bike`). */
export class BikeView implements Bike {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ example: '160 mm enduro bike' }) name: string;
  @ApiProperty({ type: ForkDto, nullable: true }) fork: ForkDto | null;
  @ApiProperty({ type: ShockDto, nullable: true }) shock: ShockDto | null;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}
