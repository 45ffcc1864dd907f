import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
} from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { BaselineSheet, BaselineSheetListItem } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { BaselineSheetsService } from './baseline-sheets.service';
import { BaselineSheetListItemView, BaselineSheetView } from './dto/baseline-sheet-views';
import { CreateBaselineSheetDto, RenameBaselineSheetDto } from './dto/create-baseline-sheet.dto';

/** An id in the path: a malformed one is just "not found", like another user's. */
const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** Saved baselines of the signed-in user. */
@ApiTags('baseline sheets')
@ApiSession()
@Controller('baseline-sheets')
export class BaselineSheetsController {
  constructor(private readonly sheets: BaselineSheetsService) {}

  @Post()
  @ApiOperation({ summary: 'Save a baseline: the server computes it from the input and keeps both.' })
  @ApiCreatedResponse({ type: BaselineSheetView })
  @ApiBadRequestResponse({ description: 'A field is missing or out of range (named in `fields`).' })
  @ApiConflictResponse({ description: 'Too many sheets kept.' })
  create(@CurrentUser() user: RequestUser, @Body() body: CreateBaselineSheetDto): Promise<BaselineSheet> {
    return this.sheets.create(user, body.name, body.input);
  }

  @Get()
  @ApiOperation({ summary: 'My sheets, newest first, with key figures (no curves).' })
  @ApiOkResponse({ type: [BaselineSheetListItemView] })
  list(@CurrentUser() user: RequestUser): Promise<BaselineSheetListItem[]> {
    return this.sheets.list(user);
  }

  @Get(':id')
  @ApiOperation({ summary: 'One sheet with its input and the result as computed then.' })
  @ApiOkResponse({ type: BaselineSheetView })
  @ApiNotFoundResponse({ description: 'No such sheet, or not mine.' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<BaselineSheet> {
    return this.sheets.get(user, id);
  }

  @Patch(':id')
  @ApiOperation({ summary: 'Rename a sheet (its input and result never change).' })
  @ApiOkResponse({ type: BaselineSheetView })
  @ApiBadRequestResponse({ description: 'The name is missing or too long.' })
  @ApiNotFoundResponse({ description: 'No such sheet, or not mine.' })
  rename(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: RenameBaselineSheetDto,
  ): Promise<BaselineSheet> {
    return this.sheets.rename(user, id, body.name);
  }

  @Delete(':id')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Delete a sheet.' })
  @ApiNoContentResponse({ description: 'Deleted.' })
  @ApiNotFoundResponse({ description: 'No such sheet, or not mine.' })
  async remove(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<void> {
    await this.sheets.remove(user, id);
  }
}
