import { ApiProperty } from '@nestjs/swagger';
import {
  RIDING_FEELS,
  RIDING_STYLES,
  type BaselineResult,
  type BaselineSheet,
  type BaselineSheetListItem,
  type BaselineSheetPartSummary,
  type RidingFeel,
  type RidingStyle,
} from '@loamline/shared-types';
import { ComputeBaselineDto } from '../../baselines/dto/compute-baseline.dto';

/** OpenAPI shapes of the sheet answers (the types live in shared-types). */
export class BaselineSheetView implements BaselineSheet {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() name: string;
  @ApiProperty({ type: ComputeBaselineDto }) input: ComputeBaselineDto;
  @ApiProperty({
    type: 'object',
    additionalProperties: true,
    description: 'shared-types BaselineResult, exactly as `POST /api/baselines/compute` answered when saved',
  })
  result: BaselineResult;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}

export class BaselineSheetPartSummaryView implements BaselineSheetPartSummary {
  @ApiProperty() targetSagPct: number;
  @ApiProperty() targetSagMm: number;
  @ApiProperty({ type: Number, nullable: true }) pressurePsi: number | null;
  @ApiProperty({ type: [Number], nullable: true, minItems: 2, maxItems: 2 }) rangePsi:
    [number, number] | null;
  @ApiProperty({ type: Number, nullable: true }) coilLbPerIn: number | null;
  @ApiProperty({ description: 'how many warnings the part has' }) warnings: number;
}

export class BaselineSheetListItemView implements BaselineSheetListItem {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() name: string;
  @ApiProperty() massKg: number;
  @ApiProperty({ enum: RIDING_STYLES }) style: RidingStyle;
  @ApiProperty({ enum: RIDING_FEELS }) feel: RidingFeel;
  @ApiProperty({ type: BaselineSheetPartSummaryView, nullable: true })
  fork: BaselineSheetPartSummaryView | null;
  @ApiProperty({ type: BaselineSheetPartSummaryView, nullable: true })
  shock: BaselineSheetPartSummaryView | null;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) updatedAt: string;
}
