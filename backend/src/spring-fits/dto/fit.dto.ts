import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  ArrayMaxSize,
  ArrayMinSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsUUID,
} from 'class-validator';
import type { FitRequest, SpringFitView, StoreFitRequest } from '@loamline/shared-types';

/** At most this many runs go into one fit. */
export const MAX_FIT_RUNS = 20;

/** `POST /api/workshop/appointments/:id/fits` */
export class FitDto implements FitRequest {
  @ApiProperty({ enum: ['fork', 'shock'], example: 'fork' })
  @IsIn(['fork', 'shock'])
  part: 'fork' | 'shock';

  @ApiPropertyOptional({
    type: [String],
    format: 'uuid',
    description: `curve attachments of this appointment and part (default: all of them; at most ${MAX_FIT_RUNS})`,
  })
  @IsOptional()
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(MAX_FIT_RUNS)
  @ArrayUnique()
  @IsUUID('all', { each: true })
  attachmentIds?: string[];
}

/** `POST /api/workshop/appointments/:id/fits/:fitId/store` */
export class StoreFitDto implements StoreFitRequest {
  @ApiPropertyOptional({ description: 'store a poor fit anyway (refused with 409 without it)' })
  @IsOptional()
  @IsBoolean()
  confirmPoor?: boolean;
}

class FittedGeometryView {
  @ApiProperty() positiveLengthMm: number;
  @ApiProperty() negativeVolumeCm3: number;
  @ApiProperty({ type: Number, nullable: true }) endStrokeVolumeCm3: number | null;
}

class IdentifiedView {
  @ApiProperty() positiveLengthMm: boolean;
  @ApiProperty() negativeVolumeCm3: boolean;
  @ApiProperty() endStrokeVolumeCm3: boolean;
  @ApiProperty() frictionN: boolean;
}

/** OpenAPI shape of a fit (shared-types `SpringFitView`). */
export class SpringFitViewDto {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ enum: ['fork', 'shock'] }) part: 'fork' | 'shock';
  @ApiProperty({ type: FittedGeometryView }) geometry: SpringFitView['geometry'];
  @ApiProperty({ description: 'friction offset, N' }) frictionN: number;
  @ApiProperty({ description: 'RMS of measured − model over every point, N' }) rmsN: number;
  @ApiProperty({ description: 'rmsN ÷ the range of the measured forces' }) relativeRms: number;
  @ApiProperty({ type: IdentifiedView, description: 'which values the runs could pin down' })
  identified: SpringFitView['identified'];
  @ApiProperty({ enum: ['good', 'poor'] }) quality: 'good' | 'poor';
  @ApiProperty({ type: [String], description: 'why the fit is poor (empty when good)' }) reasons: string[];
  @ApiProperty({ type: [String], description: 'what the runs could not pin down' }) notes: string[];
  @ApiProperty({ type: [String], description: 'the curve attachments fitted' }) runIds: string[];
  @ApiProperty({ description: 'on the bike now' }) stored: boolean;
  @ApiProperty() rejected: boolean;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}
