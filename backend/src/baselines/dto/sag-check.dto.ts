import { ApiProperty } from '@nestjs/swagger';
import { IsIn } from 'class-validator';
import type { SagCheckInput } from '@loamline/shared-types';
import { LIMITS } from '../spring-model/limits';
import { ComputeBaselineDto, InRange, Nested } from './compute-baseline.dto';

const PARTS = ['fork', 'shock'] as const;

export class MeasuredSagDto {
  @ApiProperty({ enum: PARTS, example: 'fork' })
  @IsIn(PARTS)
  part: 'fork' | 'shock';

  @InRange(LIMITS.measuredPressurePsi, { description: 'the pressure the sag was measured at', example: 80 })
  pressurePsi: number;

  @InRange(LIMITS.measuredSagMm, {
    description: 'measured sag (a shock: at the shock, on its shaft)',
    example: 48,
  })
  sagMm: number;
}

/** The body of `POST /api/baselines/sag-check`: the compute body plus what was measured. */
export class SagCheckDto extends ComputeBaselineDto implements SagCheckInput {
  @Nested(() => MeasuredSagDto)
  measured: MeasuredSagDto;
}
