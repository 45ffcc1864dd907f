import { Body, Controller, HttpCode, HttpStatus, Post } from '@nestjs/common';
import { ApiBadRequestResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { BaselineResult, SagCheckResult } from '@loamline/shared-types';
import { Public } from '../common/decorators/public.decorator';
import { BaselinesService } from './baselines.service';
import { ComputeBaselineDto } from './dto/compute-baseline.dto';
import { SagCheckDto } from './dto/sag-check.dto';

@ApiTags('baselines')
@Controller('baselines')
export class BaselinesController {
  constructor(private readonly baselines: BaselinesService) {}

  @Public()
  @Post('compute')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary: 'A starting sag, pressure or coil rate, spring curves and cautions for a rider and bike',
  })
  @ApiOkResponse({ description: 'The baseline (shared-types BaselineResult); nothing is stored.' })
  @ApiBadRequestResponse({ description: 'Bad input; `fields` names each bad field.' })
  compute(@Body() body: ComputeBaselineDto): BaselineResult {
    return this.baselines.compute(body);
  }

  @Public()
  @Post('sag-check')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'From a measured sag at a known pressure, how much air to add or let out' })
  @ApiOkResponse({ description: 'shared-types SagCheckResult: the new pressure and the change.' })
  @ApiBadRequestResponse({ description: 'Bad input; `fields` names each bad field.' })
  sagCheck(@Body() body: SagCheckDto): SagCheckResult {
    return this.baselines.sagCheck(body);
  }
}
