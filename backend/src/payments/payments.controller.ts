import { Controller, Get, Headers, HttpCode, HttpStatus, Post, Req } from '@nestjs/common';
import { ApiBadRequestResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import type { PaymentsClientConfig } from '@loamline/shared-types';
import { Public } from '../common/decorators/public.decorator';
import { CrossSiteAllowed } from '../common/security/request-origin.guard';
import { PaymentsService } from './payments.service';

/** What the browser needs to load the payment library, and the payment service's webhook. */
@ApiTags('payments')
@Controller('payments')
export class PaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  @Public()
  @Get('config')
  @ApiOperation({ summary: 'The publishable key and the payment script to load (public).' })
  @ApiOkResponse({ description: '`{ publishableKey, scriptUrl }`' })
  config(): PaymentsClientConfig {
    return this.payments.clientConfig();
  }

  @Public()
  @CrossSiteAllowed('signed by the payment service: Stripe-Signature over the raw body')
  @Post('webhook')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary:
      'Events from the payment service. The signature is checked on the raw body; each event id is acted on once.',
  })
  @ApiBadRequestResponse({ description: 'Forged, unsigned or stale signature: nothing changes.' })
  webhook(
    @Req() req: Request & { rawBody?: Buffer },
    @Headers('stripe-signature') signature: string | undefined,
  ): Promise<{ received: true }> {
    return this.payments.webhook(req.rawBody, signature);
  }
}
