import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, IsUUID, Length, Matches, MaxLength } from 'class-validator';
import type {
  CancelAppointmentRequest,
  CreateAppointmentRequest,
  DeclineAppointmentRequest,
  MoveAppointmentRequest,
} from '@loamline/shared-types';

const ISO_WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})$/;

export class CreateAppointmentDto implements CreateAppointmentRequest {
  @ApiProperty({ example: 'mossgrund-federwerk' })
  @IsString()
  @Length(1, 80)
  shopSlug: string;

  @ApiProperty({ format: 'uuid' })
  @IsUUID()
  serviceId: string;

  @ApiProperty({ example: '2027-03-29T09:00:00+02:00', description: 'one of the starts availability offers' })
  @Matches(ISO_WITH_OFFSET, { message: 'must be an ISO-8601 time with its offset' })
  start: string;

  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsUUID()
  bikeId?: string;

  @ApiPropertyOptional({ format: 'uuid' })
  @IsOptional()
  @IsUUID()
  baselineSheetId?: string;

  @ApiPropertyOptional({ maxLength: 2000 })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  notes?: string;
}

export class MoveAppointmentDto implements MoveAppointmentRequest {
  @ApiProperty({ example: '2027-03-30T10:00:00+02:00' })
  @Matches(ISO_WITH_OFFSET, { message: 'must be an ISO-8601 time with its offset' })
  start: string;
}

export class DeclineAppointmentDto implements DeclineAppointmentRequest {
  @ApiProperty({ example: 'The bench is down for repair that day.' })
  @IsString()
  @Length(1, 500)
  reason: string;
}

export class CancelAppointmentDto implements CancelAppointmentRequest {
  @ApiPropertyOptional({ maxLength: 500 })
  @IsOptional()
  @IsString()
  @MaxLength(500)
  reason?: string;
}

export class AvailabilityQueryDto {
  @ApiProperty({ format: 'uuid' })
  @IsUUID()
  serviceId: string;

  @ApiProperty({ example: '2027-03-28', description: 'local date in the shop zone' })
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  from: string;

  @ApiProperty({ example: '2027-04-03', description: 'local date in the shop zone, inclusive' })
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  to: string;
}

export class WorkshopAppointmentsQueryDto {
  @ApiPropertyOptional({ example: 'requested,confirmed', description: 'states, comma-separated' })
  @IsOptional()
  @Matches(/^[a-z_]+(,[a-z_]+)*$/, { message: 'must be states separated by commas' })
  status?: string;

  @ApiPropertyOptional({ example: '2027-03-28' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  from?: string;

  @ApiPropertyOptional({ example: '2027-04-03' })
  @IsOptional()
  @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'must be a date YYYY-MM-DD' })
  to?: string;

  @ApiPropertyOptional({ description: 'rider name, e-mail or bike name' })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;
}
