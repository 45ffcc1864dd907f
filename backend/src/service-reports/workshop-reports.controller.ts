import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Post,
  Put,
  Query,
  Res,
  StreamableFile,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import {
  ApiBody,
  ApiConflictResponse,
  ApiConsumes,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiPayloadTooLargeResponse,
  ApiProduces,
  ApiQuery,
  ApiTags,
} from '@nestjs/swagger';
import type { Response } from 'express';
import { memoryStorage } from 'multer';
import { ATTACHMENT_KINDS, type Attachment, type ServiceReport } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { MultipartAllowed } from '../common/security/request-origin.guard';
import { ServiceReportInputDto, UploadAttachmentDto } from './dto/service-report.dto';
import { inlineDisposition } from './file-names';
import { ServiceReportsService, type UploadedFileBytes } from './service-reports.service';
import { UPLOAD_LIMITS, UploadErrorsInterceptor } from './upload-errors.interceptor';
import type { StoredObject } from './upload-store';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/**
 * Streams stored bytes on as they were detected, never sniffed, shown inline under the cleaned
 * name. A store that fails mid-stream: StreamableFile's own handler logs it and cuts the
 * connection (fewer bytes than Content-Length said), never a short file that looks whole; a
 * client that goes away closes the store's stream.
 */
export function sendFile(
  res: Response,
  f: { file: StoredObject; contentType: string; name: string },
): StreamableFile {
  res.setHeader('X-Content-Type-Options', 'nosniff');
  return new StreamableFile(f.file.body, {
    type: f.contentType,
    disposition: inlineDisposition(f.name),
    length: f.file.length,
  });
}

/** Workshop › an appointment's service report: the staff of its shop, and nobody else (404). */
@ApiTags('workshop')
@ApiSession()
@ApiForbiddenResponse({ description: 'Not staff of a shop, or a form from another site.' })
@ApiNotFoundResponse({ description: 'No such appointment (or file) at this shop.' })
@Roles('technician', 'owner')
@Controller('workshop/appointments')
export class WorkshopReportsController {
  constructor(private readonly reports: ServiceReportsService) {}

  @Get(':id/report')
  @ApiOperation({
    summary:
      "The appointment's service report; before the first save an empty draft with the service's checklist.",
  })
  @ApiOkResponse({ description: 'ServiceReport' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<ServiceReport> {
    return this.reports.getForStaff(user, id);
  }

  @Put(':id/report')
  @ApiOperation({
    summary: 'Save the draft. `version` is the one the edit started from; a newer save in between is a 409.',
  })
  @ApiOkResponse({ description: 'ServiceReport' })
  @ApiConflictResponse({
    description: 'Final (the appointment was completed), or saved by someone else meanwhile.',
  })
  save(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: ServiceReportInputDto,
  ): Promise<ServiceReport> {
    return this.reports.save(user, id, body);
  }

  @Post(':id/attachments')
  @MultipartAllowed('photo and bench-curve uploads (multipart/form-data); same-origin still required')
  @UseInterceptors(
    UploadErrorsInterceptor,
    FileInterceptor('file', { storage: memoryStorage(), limits: UPLOAD_LIMITS }),
  )
  @ApiOperation({
    summary:
      'Upload a photo (JPEG, PNG, WebP by content; ≤ 8 MB; ≤ 6 per appointment) or a bench curve (CSV ≤ 1 MB, with the settings it was run at).',
  })
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file', 'kind'],
      properties: {
        file: { type: 'string', format: 'binary' },
        kind: { type: 'string', enum: [...ATTACHMENT_KINDS] },
        label: { type: 'string', maxLength: 80, description: 'curves' },
        part: { type: 'string', enum: ['fork', 'shock'], description: 'curves' },
        mainPsi: { type: 'number', minimum: 0, maximum: 1000, description: 'curves: gauge psi' },
        endStrokePsi: { type: 'number', minimum: 0, maximum: 1000, description: 'curves, optional' },
        spacers: { type: 'integer', minimum: 0, maximum: 10, description: 'curves' },
      },
    },
  })
  @ApiCreatedResponse({ description: 'Attachment' })
  @ApiPayloadTooLargeResponse({ description: 'A photo over 8 MB or a curve over 1 MB.' })
  @ApiConflictResponse({ description: 'The report is final, or the appointment already has 6 photos.' })
  upload(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: UploadAttachmentDto,
    @UploadedFile() file: UploadedFileBytes | undefined,
  ): Promise<Attachment> {
    return this.reports.upload(user, id, body, file);
  }

  @Get(':id/attachments/:attachmentId')
  @ApiOperation({ summary: 'The bytes of a photo (`?thumb=1`: its 320 px JPEG thumbnail) or a curve file.' })
  @ApiQuery({ name: 'thumb', required: false, enum: ['1'] })
  @ApiProduces('image/jpeg', 'image/png', 'image/webp', 'text/csv')
  @ApiOkResponse({ description: 'The file, inline, with its detected type.' })
  async file(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Param('attachmentId', uuid) attachmentId: string,
    @Query('thumb') thumb: string | undefined,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return sendFile(res, await this.reports.file(user, id, attachmentId, 'staff', thumb === '1'));
  }

  @Delete(':id/attachments/:attachmentId')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Remove a photo or curve (row and bytes) while the report is a draft.' })
  @ApiNoContentResponse({ description: 'Removed.' })
  @ApiConflictResponse({ description: 'The report is final.' })
  remove(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Param('attachmentId', uuid) attachmentId: string,
  ): Promise<void> {
    return this.reports.remove(user, id, attachmentId);
  }
}
