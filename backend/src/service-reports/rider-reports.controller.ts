import {
  Controller,
  Get,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Query,
  Res,
  StreamableFile,
} from '@nestjs/common';
import {
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiProduces,
  ApiQuery,
  ApiTags,
} from '@nestjs/swagger';
import type { Response } from 'express';
import type { ServiceReport } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { ServiceReportsService } from './service-reports.service';
import { sendFile } from './workshop-reports.controller';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** The rider's service report and its files: only their own, and only once the report is final. */
@ApiTags('appointments')
@ApiSession()
@Roles('rider')
@ApiNotFoundResponse({ description: 'No such appointment, not mine, or its report is not final yet.' })
@Controller('appointments')
export class RiderReportsController {
  constructor(private readonly reports: ServiceReportsService) {}

  @Get(':id/report')
  @ApiOperation({ summary: 'The service report, once the shop completed the appointment.' })
  @ApiOkResponse({ description: 'ServiceReport' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<ServiceReport> {
    return this.reports.getForRider(user, id);
  }

  @Get(':id/attachments/:attachmentId')
  @ApiOperation({ summary: 'A photo (`?thumb=1`: its thumbnail) or curve file of the final report.' })
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
    return sendFile(res, await this.reports.file(user, id, attachmentId, 'rider', thumb === '1'));
  }
}
