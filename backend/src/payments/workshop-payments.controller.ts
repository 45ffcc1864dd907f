import { Body, Controller, Get, HttpStatus, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { WorkshopPaymentRow, WorkshopPayments } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { RefundDto, WorkshopPaymentsQueryDto } from './dto/payment.dto';
import { PaymentsService } from './payments.service';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** Workshop › Payments: the owner of the shop, and nobody else. */
@ApiTags('workshop')
@ApiSession()
@Roles('owner')
@ApiForbiddenResponse({ description: 'Not the owner of a shop.' })
@Controller('workshop/payments')
export class WorkshopPaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  @Get()
  @ApiOperation({ summary: 'Payments and refunds in a range of days, with totals by day.' })
  @ApiOkResponse({ description: 'WorkshopPayments' })
  list(@CurrentUser() user: RequestUser, @Query() q: WorkshopPaymentsQueryDto): Promise<WorkshopPayments> {
    return this.payments.workshopList(user, q);
  }

  @Get(':id')
  @ApiOperation({ summary: 'One payment with its refunds.' })
  @ApiNotFoundResponse({ description: 'No such payment at this shop.' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<WorkshopPaymentRow> {
    return this.payments.workshopRow(user, id);
  }

  @Post(':id/refunds')
  @ApiOperation({ summary: 'Refund by hand, in full or in part, with a reason (recorded with who did it).' })
  @ApiOkResponse({ description: 'WorkshopPaymentRow, with the refund' })
  @ApiBadRequestResponse({ description: 'More than is left to refund, or no reason.' })
  @ApiConflictResponse({ description: 'Nothing was paid.' })
  @ApiNotFoundResponse({ description: 'No such payment at this shop.' })
  refund(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: RefundDto,
  ): Promise<WorkshopPaymentRow> {
    return this.payments.refundByHand(user, id, body);
  }
}
