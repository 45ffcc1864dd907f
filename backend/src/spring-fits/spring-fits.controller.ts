import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { SpringFitView } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { FitDto, SpringFitViewDto, StoreFitDto } from './dto/fit.dto';
import { SpringFitsService } from './spring-fits.service';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/**
 * Workshop › the bike's measured spring. Staff of the appointment's shop (owner or technician);
 * anyone else, riders included, gets 404 (no role guard: a 403 would tell them the route exists for
 * that appointment).
 */
@ApiTags('workshop')
@ApiSession()
@ApiNotFoundResponse({ description: 'No such appointment (or fit) at your shop.' })
@Controller('workshop/appointments/:id/fits')
export class SpringFitsController {
  constructor(private readonly fits: SpringFitsService) {}

  @Get()
  @ApiOperation({ summary: "The appointment's spring fits, oldest first." })
  @ApiOkResponse({ type: [SpringFitViewDto] })
  list(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<SpringFitView[]> {
    return this.fits.list(user, id);
  }

  @Post()
  @ApiOperation({
    summary:
      "Fit the part's geometry (positive air column, negative and end-stroke volumes, friction) to the appointment's curve runs; proposed until stored or rejected. A poor fit says why.",
  })
  @ApiCreatedResponse({ type: SpringFitViewDto })
  @ApiBadRequestResponse({
    description: 'A body field is wrong, or a named run is not a curve of that part.',
  })
  @ApiConflictResponse({
    description: 'No bike on the appointment, no such air part on it, or no curve runs of that part.',
  })
  fit(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: FitDto,
  ): Promise<SpringFitView> {
    return this.fits.fit(user, id, body);
  }

  @Post(':fitId/store')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary:
      "Store the fit on the appointment's bike as the part's measured spring (later baselines use it); the previous stored fit of that part is no longer stored.",
  })
  @ApiOkResponse({ type: SpringFitViewDto })
  @ApiConflictResponse({
    description: 'A poor fit without confirmPoor, a rejected fit, or the bike or part is gone.',
  })
  store(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Param('fitId', uuid) fitId: string,
    @Body() body: StoreFitDto,
  ): Promise<SpringFitView> {
    return this.fits.store(user, id, fitId, body);
  }

  @Post(':fitId/reject')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Set the fit aside (a stored fit stays on the bike: 409).' })
  @ApiOkResponse({ type: SpringFitViewDto })
  @ApiConflictResponse({ description: 'The fit is stored on the bike.' })
  reject(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Param('fitId', uuid) fitId: string,
  ): Promise<SpringFitView> {
    return this.fits.reject(user, id, fitId);
  }
}
