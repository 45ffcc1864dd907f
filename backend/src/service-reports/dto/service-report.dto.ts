import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Length,
  Max,
  MaxLength,
  Min,
  ValidateNested,
} from 'class-validator';
import {
  ATTACHMENT_KINDS,
  type AttachmentKind,
  type ChecklistItem,
  type PartSettings,
  REPORT_LIMITS as L,
  type ServiceReportInput,
} from '@loamline/shared-types';

const trim = Transform(({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.normalize('NFC').trim() : value,
);

export class ChecklistItemDto implements ChecklistItem {
  @ApiProperty({ example: 'Dust wipers and foam rings replaced', maxLength: L.checklistLabelChars })
  @trim
  @IsString()
  @Length(1, L.checklistLabelChars)
  label: string;

  @ApiProperty()
  @IsBoolean()
  done: boolean;
}

/** One part's settings; every field may be null (not set, or the part has none). */
export class PartSettingsDto implements PartSettings {
  @ApiPropertyOptional({ nullable: true, minimum: L.psi.min, maximum: L.psi.max, description: 'gauge psi' })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.psi.min)
  @Max(L.psi.max)
  mainPsi: number | null = null;

  @ApiPropertyOptional({ nullable: true, minimum: L.psi.min, maximum: L.psi.max, description: 'gauge psi' })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.psi.min)
  @Max(L.psi.max)
  endStrokePsi: number | null = null;

  @ApiPropertyOptional({ nullable: true, minimum: L.spacers.min, maximum: L.spacers.max })
  @IsOptional()
  @IsInt()
  @Min(L.spacers.min)
  @Max(L.spacers.max)
  spacers: number | null = null;

  @ApiPropertyOptional({
    nullable: true,
    minimum: L.springRateLbPerIn.min,
    maximum: L.springRateLbPerIn.max,
    description: 'coil rate, lb/in',
  })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.springRateLbPerIn.min)
  @Max(L.springRateLbPerIn.max)
  springRateLbPerIn: number | null = null;

  @ApiPropertyOptional({
    nullable: true,
    minimum: L.clicks.min,
    maximum: L.clicks.max,
    description: 'from closed',
  })
  @IsOptional()
  @IsInt()
  @Min(L.clicks.min)
  @Max(L.clicks.max)
  reboundClicks: number | null = null;

  @ApiPropertyOptional({
    nullable: true,
    minimum: L.clicks.min,
    maximum: L.clicks.max,
    description: 'from closed',
  })
  @IsOptional()
  @IsInt()
  @Min(L.clicks.min)
  @Max(L.clicks.max)
  compressionClicks: number | null = null;

  @ApiPropertyOptional({ nullable: true, minimum: L.sagMm.min, maximum: L.sagMm.max, description: 'mm' })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.sagMm.min)
  @Max(L.sagMm.max)
  sagMm: number | null = null;
}

/** `PUT /api/workshop/appointments/:id/report` */
export class ServiceReportInputDto implements ServiceReportInput {
  @ApiProperty({ minimum: 0, description: 'the version the edit started from (0 before the first save)' })
  @IsInt()
  @Min(0)
  version: number;

  @ApiProperty({ type: [ChecklistItemDto], maxItems: L.checklistItems })
  @IsArray()
  @ArrayMaxSize(L.checklistItems)
  @ValidateNested({ each: true })
  @Type(() => ChecklistItemDto)
  checklist: ChecklistItemDto[];

  @ApiProperty({ maxLength: L.notesChars })
  @IsString()
  @MaxLength(L.notesChars)
  notes: string;

  @ApiProperty({ type: PartSettingsDto, nullable: true })
  @IsOptional()
  @ValidateNested()
  @Type(() => PartSettingsDto)
  fork: PartSettingsDto | null;

  @ApiProperty({ type: PartSettingsDto, nullable: true })
  @IsOptional()
  @ValidateNested()
  @Type(() => PartSettingsDto)
  shock: PartSettingsDto | null;
}

const blankToUndefined = Transform(({ value }: { value: unknown }) =>
  value === '' || value === null ? undefined : value,
);

/**
 * The text fields of `POST /api/workshop/appointments/:id/attachments` (multipart; the file is
 * `file`). A curve names the settings it was run at; a photo needs only `kind`.
 */
export class UploadAttachmentDto {
  @ApiProperty({ enum: ATTACHMENT_KINDS })
  @IsIn(ATTACHMENT_KINDS)
  kind: AttachmentKind;

  @ApiPropertyOptional({
    maxLength: L.curveLabelChars,
    description: 'curves: e.g. "Fork at 85 psi, 2 spacers"',
  })
  @blankToUndefined
  @IsOptional()
  @trim
  @IsString()
  @Length(1, L.curveLabelChars)
  label?: string;

  @ApiPropertyOptional({ enum: ['fork', 'shock'], description: 'curves' })
  @blankToUndefined
  @IsOptional()
  @IsIn(['fork', 'shock'])
  part?: 'fork' | 'shock';

  @ApiPropertyOptional({ minimum: L.psi.min, maximum: L.psi.max, description: 'curves: gauge psi' })
  @blankToUndefined
  @IsOptional()
  @Type(() => Number)
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.psi.min)
  @Max(L.psi.max)
  mainPsi?: number;

  @ApiPropertyOptional({ minimum: L.psi.min, maximum: L.psi.max, description: 'curves: gauge psi, if any' })
  @blankToUndefined
  @IsOptional()
  @Type(() => Number)
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(L.psi.min)
  @Max(L.psi.max)
  endStrokePsi?: number;

  @ApiPropertyOptional({ minimum: L.spacers.min, maximum: L.spacers.max, description: 'curves' })
  @blankToUndefined
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(L.spacers.min)
  @Max(L.spacers.max)
  spacers?: number;
}
