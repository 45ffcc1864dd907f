import { Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import {
  ApiConflictResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiServiceUnavailableResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { Appointment, PaymentSession } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { PaymentsService } from './payments.service';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** The rider pays for a held appointment. */
@ApiTags('appointments')
@ApiSession()
@Roles('rider')
@ApiNotFoundResponse({ description: 'No such appointment, or not mine.' })
@ApiServiceUnavailableResponse({ description: 'The payment service cannot be reached.' })
@Controller('appointments')
export class AppointmentPaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  @Get(':id/payment')
  @ApiOperation({ summary: 'What the payment step needs, while the appointment is held and unpaid.' })
  @ApiOkResponse({ description: 'PaymentSession' })
  @ApiConflictResponse({ description: 'Nothing is due, or the hold has ended.' })
  session(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<PaymentSession> {
    return this.payments.session(user, id);
  }

  @Post(':id/payment/sync')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary:
      'Ask the payment service about this appointment’s payment and apply it (after the browser paid).',
  })
  @ApiOkResponse({ description: 'Appointment' })
  sync(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.payments.sync(user, id);
  }
}
