import { applyDecorators } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsISO8601,
  IsNotEmpty,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import {
  RIDING_FEELS,
  RIDING_STYLES,
  SPRING_TYPES,
  type AirSpringGeometry,
  type BaselineInput,
  type ConditionsInput,
  type EndStrokeInput,
  type ForkInput,
  type MeasuredSpring,
  type RiderInput,
  type RidingFeel,
  type RidingInput,
  type RidingStyle,
  type ShockInput,
  type SpringType,
} from '@loamline/shared-types';
import { LIMITS, type Limit } from '../spring-model/limits';

/** A finite number within one of the model's LIMITS, documented in OpenAPI. */
export function InRange(
  limit: Limit,
  opts: { optional?: boolean; description?: string; example?: number } = {},
) {
  const doc = {
    type: Number,
    minimum: limit.min,
    maximum: limit.max,
    description: [opts.description, limit.unit && `in ${limit.unit}`].filter(Boolean).join(', ') || undefined,
    example: opts.example,
  };
  return applyDecorators(
    ...(opts.optional ? [IsOptional(), ApiPropertyOptional(doc)] : [ApiProperty(doc)]),
    IsNumber({ allowNaN: false, allowInfinity: false }),
    Min(limit.min),
    Max(limit.max),
  );
}

/** A nested object, validated with its own class (`optional`: may be missing or null). */
export function Nested(cls: () => new () => object, opts: { optional?: boolean; nullable?: boolean } = {}) {
  const doc = { type: cls, nullable: opts.nullable };
  return applyDecorators(
    ...(opts.optional || opts.nullable ? [IsOptional()] : []),
    opts.optional ? ApiPropertyOptional(doc) : ApiProperty(doc),
    IsObject(),
    ValidateNested(),
    Type(cls),
  );
}

/** Air-spring geometry; every field optional, the rest comes from the defaults table. */
export class AirSpringGeometryDto implements Partial<AirSpringGeometry> {
  @InRange(LIMITS.pistonDiameterMm, { optional: true, description: 'air piston diameter D' })
  pistonDiameterMm?: number;

  @InRange(LIMITS.shaftDiameterMm, {
    optional: true,
    description: 'air shaft diameter d (equal to D: no negative chamber)',
  })
  shaftDiameterMm?: number;

  @InRange(LIMITS.positiveLengthMm, {
    optional: true,
    description: 'effective positive air column at full extension L₀ (> travel)',
  })
  positiveLengthMm?: number;

  @InRange(LIMITS.negativeVolumeCm3, {
    optional: true,
    description: 'negative chamber volume at full extension (0: none)',
  })
  negativeVolumeCm3?: number;

  @InRange(LIMITS.spacerVolumeCm3, { optional: true, description: 'volume one spacer takes' })
  spacerVolumeCm3?: number;

  @InRange(LIMITS.endStrokeVolumeCm3, { optional: true, description: 'end-stroke chamber volume' })
  endStrokeVolumeCm3?: number;

  @InRange(LIMITS.polytropicIndex, { optional: true, description: 'polytropic index of a fast hit' })
  polytropicIndex?: number;
}

/** Friction a bench fit may report, N (from 0; a seal far above this is not an air spring to model). */
export const MEASURED_FRICTION_MAX_N = 5000;

/**
 * A part's measured spring (shared-types `MeasuredSpring`), as a shop's fit stored it on the bike:
 * its volumes replace the default geometry (the rider's explicit `geometry` still wins).
 */
export class MeasuredSpringDto implements MeasuredSpring {
  @InRange(LIMITS.positiveLengthMm, { description: 'fitted positive air column at full extension L₀' })
  positiveLengthMm: number;

  @InRange(LIMITS.negativeVolumeCm3, { description: 'fitted negative chamber volume at full extension' })
  negativeVolumeCm3: number;

  @ApiProperty({
    type: Number,
    nullable: true,
    minimum: LIMITS.endStrokeVolumeCm3.min,
    maximum: LIMITS.endStrokeVolumeCm3.max,
    description: 'fitted end-stroke chamber volume, in cm³; null when the runs did not reach it',
  })
  @ValidateIf((_, v) => v !== null)
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(LIMITS.endStrokeVolumeCm3.min)
  @Max(LIMITS.endStrokeVolumeCm3.max)
  endStrokeVolumeCm3: number | null;

  @ApiProperty({ minimum: 0, maximum: MEASURED_FRICTION_MAX_N, description: 'fitted friction offset, in N' })
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(0)
  @Max(MEASURED_FRICTION_MAX_N)
  frictionN: number;

  @ApiProperty({ example: 'measured on 2 December 2026 at Kettle Ridge Suspension Lab' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(300)
  label: string;

  @ApiProperty({ format: 'date-time' })
  @IsISO8601({ strict: true })
  measuredAt: string;

  @ApiProperty({ example: 'Kettle Ridge Suspension Lab' })
  @IsString()
  @IsNotEmpty()
  @MaxLength(120)
  shopName: string;

  @ApiProperty({ format: 'uuid' })
  @IsUUID()
  appointmentId: string;
}

export class RiderDto implements RiderInput {
  @InRange(LIMITS.massKg, { description: 'the rider with riding gear', example: 82 })
  massKg: number;

  @InRange(LIMITS.frontShare, {
    optional: true,
    description:
      "share of the rider's weight on the front wheel, standing in the riding position where fork sag is measured (default 0.42)",
  })
  frontShare?: number;

  @InRange(LIMITS.seatedRearShare, {
    optional: true,
    description:
      "share of the rider's weight on the rear wheel, seated, where rear sag is measured (default 0.72)",
  })
  seatedRearShare?: number;
}

export class RidingDto implements RidingInput {
  @ApiProperty({ enum: RIDING_STYLES, example: 'trail' })
  @IsIn(RIDING_STYLES)
  style: RidingStyle;

  @ApiProperty({ enum: RIDING_FEELS, example: 'balanced' })
  @IsIn(RIDING_FEELS)
  feel: RidingFeel;
}

export class ConditionsDto implements ConditionsInput {
  @InRange(LIMITS.altitudeM, { optional: true, description: 'where you ride (default 0)' })
  altitudeM?: number;

  @InRange(LIMITS.altitudeM, {
    optional: true,
    description: 'where you pump and measure sag (default: where you ride)',
  })
  pumpAltitudeM?: number;

  @InRange(LIMITS.temperatureC, {
    optional: true,
    description:
      'where you pump and ride (default 20): the baseline is the gauge pressure at this temperature',
  })
  temperatureC?: number;
}

export class EndStrokeDto implements EndStrokeInput {
  @InRange(LIMITS.endStrokePsi, {
    optional: true,
    description: 'end-stroke chamber pressure (gauge); leave out for the recommended pressure',
    example: 180,
  })
  pressurePsi?: number;

  @InRange(LIMITS.maxPressurePsi, {
    optional: true,
    description: "the end-stroke chamber's rated maximum (default: a labelled estimate)",
  })
  maxPressurePsi?: number;
}

export class ForkDto implements ForkInput {
  @InRange(LIMITS.forkTravelMm, { example: 160 })
  travelMm: number;

  @InRange(LIMITS.stanchionMm, { description: 'stanchion outer diameter', example: 36 })
  stanchionMm: number;

  @ApiProperty({ enum: SPRING_TYPES, example: 'air' })
  @IsIn(SPRING_TYPES)
  spring: SpringType;

  @ApiProperty({ minimum: LIMITS.spacers.min, maximum: LIMITS.spacers.max, example: 0 })
  @IsInt()
  @Min(LIMITS.spacers.min)
  @Max(LIMITS.spacers.max)
  spacers: number;

  @Nested(() => EndStrokeDto, { optional: true })
  endStroke?: EndStrokeDto;

  @InRange(LIMITS.maxPressurePsi, { optional: true, description: 'rated maximum pressure' })
  maxPressurePsi?: number;

  @InRange(LIMITS.targetSagPct, { optional: true, description: 'overrides the sag table' })
  targetSagPct?: number;

  @Nested(() => AirSpringGeometryDto, { optional: true })
  geometry?: AirSpringGeometryDto;

  @Nested(() => MeasuredSpringDto, { optional: true, nullable: true })
  measured?: MeasuredSpringDto | null;
}

export class ShockDto implements ShockInput {
  @InRange(LIMITS.shockStrokeMm, { example: 65 })
  strokeMm: number;

  @InRange(LIMITS.wheelTravelMm, { example: 165 })
  wheelTravelMm: number;

  @ApiProperty({ enum: SPRING_TYPES, example: 'air' })
  @IsIn(SPRING_TYPES)
  spring: SpringType;

  @ApiProperty({ minimum: LIMITS.spacers.min, maximum: LIMITS.spacers.max, example: 0 })
  @IsInt()
  @Min(LIMITS.spacers.min)
  @Max(LIMITS.spacers.max)
  spacers: number;

  @InRange(LIMITS.maxPressurePsi, { optional: true, description: 'rated maximum pressure' })
  maxPressurePsi?: number;

  @InRange(LIMITS.targetSagPct, { optional: true, description: 'overrides the sag table (share of stroke)' })
  targetSagPct?: number;

  @InRange(LIMITS.leverageRatioAtSag, {
    optional: true,
    description: 'leverage ratio at sag, from the bike’s leverage curve (default: wheel travel ÷ stroke)',
  })
  leverageRatioAtSag?: number;

  @Nested(() => AirSpringGeometryDto, { optional: true })
  geometry?: AirSpringGeometryDto;

  @Nested(() => MeasuredSpringDto, { optional: true, nullable: true })
  measured?: MeasuredSpringDto | null;
}

/** The body of `POST /api/baselines/compute` (shared-types `BaselineInput`). */
export class ComputeBaselineDto implements BaselineInput {
  @Nested(() => RiderDto)
  rider: RiderDto;

  @Nested(() => RidingDto)
  riding: RidingDto;

  @Nested(() => ConditionsDto, { optional: true })
  conditions?: ConditionsDto;

  @Nested(() => ForkDto, { nullable: true })
  fork: ForkDto | null;

  @Nested(() => ShockDto, { nullable: true })
  shock: ShockDto | null;
}
