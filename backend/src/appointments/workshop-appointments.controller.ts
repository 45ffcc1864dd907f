import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
} from '@nestjs/common';
import {
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Appointment, WorkshopAppointment } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { AppointmentsService } from './appointments.service';
import {
  CancelAppointmentDto,
  DeclineAppointmentDto,
  MoveAppointmentDto,
  WorkshopAppointmentsQueryDto,
} from './dto/appointment.dto';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** Workshop › Requests and Schedule: the staff of the appointment's shop, and nobody else. */
@ApiTags('workshop')
@ApiSession()
@ApiForbiddenResponse({ description: 'Not staff of a shop.' })
@ApiNotFoundResponse({ description: 'No such appointment at this shop.' })
@ApiConflictResponse({
  description: 'Not possible in its state (the transition table), or changed meanwhile.',
})
@Roles('technician', 'owner')
@Controller('workshop/appointments')
export class WorkshopAppointmentsController {
  constructor(private readonly appointments: AppointmentsService) {}

  @Get()
  @ApiOperation({ summary: "The shop's appointments, filtered by state, local dates and a search." })
  @ApiOkResponse({ description: 'WorkshopAppointment[]' })
  list(
    @CurrentUser() user: RequestUser,
    @Query() q: WorkshopAppointmentsQueryDto,
  ): Promise<WorkshopAppointment[]> {
    return this.appointments.listForShop(user, q);
  }

  @Get(':id')
  @ApiOperation({ summary: "One appointment with the rider's weight, bike and sheet." })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<WorkshopAppointment> {
    return this.appointments.getForShop(user, id);
  }

  @Post(':id/confirm')
  @HttpCode(HttpStatus.OK)
  confirm(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.act(user, id, 'confirm', 'staff');
  }

  @Post(':id/decline')
  @HttpCode(HttpStatus.OK)
  decline(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: DeclineAppointmentDto,
  ): Promise<Appointment> {
    return this.appointments.act(user, id, 'decline', 'staff', body);
  }

  @Post(':id/propose')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Propose another time; the rider accepts or turns it down.' })
  propose(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: MoveAppointmentDto,
  ): Promise<WorkshopAppointment> {
    return this.appointments.propose(user, id, body.start);
  }

  @Post(':id/cancel')
  @HttpCode(HttpStatus.OK)
  cancel(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: CancelAppointmentDto,
  ): Promise<Appointment> {
    return this.appointments.act(user, id, 'cancel', 'staff', body);
  }

  @Post(':id/complete')
  @HttpCode(HttpStatus.OK)
  complete(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.act(user, id, 'complete', 'staff');
  }

  @Post(':id/no-show')
  @HttpCode(HttpStatus.OK)
  noShow(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.act(user, id, 'no-show', 'staff');
  }
}
