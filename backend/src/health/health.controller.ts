import { Controller, Get, HttpStatus, Res } from '@nestjs/common';
import { ApiOkResponse, ApiServiceUnavailableResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { HealthStatus } from '@loamline/shared-types';
import { Public } from '../common/decorators/public.decorator';
import { RETRY_AFTER_SECONDS } from '../common/filters/database-errors';
import { HealthService } from './health.service';

@ApiTags('health')
@Public()
@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  @Get()
  @ApiOkResponse({ description: 'The server and its database answer.' })
  @ApiServiceUnavailableResponse({ description: 'The database does not answer.' })
  async check(@Res({ passthrough: true }) res: Response): Promise<HealthStatus> {
    const status = await this.health.check();
    if (status.db === 'down') {
      res.status(HttpStatus.SERVICE_UNAVAILABLE);
      res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS)); // RFC 9110, section 10.2.3
    }
    return status;
  }
}
