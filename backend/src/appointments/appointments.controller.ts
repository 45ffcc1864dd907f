import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import {
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Appointment, AppointmentCreated } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { AppointmentsService } from './appointments.service';
import { CancelAppointmentDto, CreateAppointmentDto, MoveAppointmentDto } from './dto/appointment.dto';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** A rider's appointments: book, read, cancel, move, answer a proposal. */
@ApiTags('appointments')
@ApiSession()
@Roles('rider')
@Controller('appointments')
export class AppointmentsController {
  constructor(private readonly appointments: AppointmentsService) {}

  @Post()
  @ApiOperation({ summary: 'Book a free time: held while a payment is due, else requested.' })
  @ApiCreatedResponse({ description: '`{ id, status, holdExpiresAt? }`' })
  @ApiConflictResponse({ description: 'The time is no longer free, or not one the shop offers.' })
  book(@CurrentUser() user: RequestUser, @Body() body: CreateAppointmentDto): Promise<AppointmentCreated> {
    return this.appointments.book(user, body);
  }

  @Get()
  @ApiOperation({ summary: 'My appointments, newest start first.' })
  @ApiOkResponse({ description: 'Appointment[]' })
  list(@CurrentUser() user: RequestUser): Promise<Appointment[]> {
    return this.appointments.listMine(user);
  }

  @Get(':id')
  @ApiOperation({ summary: 'One of my appointments.' })
  @ApiNotFoundResponse({ description: 'No such appointment, or not mine.' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.getMine(user, id);
  }

  @Post(':id/cancel')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Cancel before it starts; the time is free again at once.' })
  @ApiConflictResponse({ description: 'Not possible in its state, or it has started.' })
  cancel(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: CancelAppointmentDto,
  ): Promise<Appointment> {
    return this.appointments.act(user, id, 'cancel', 'rider', body);
  }

  @Post(':id/move')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Move to another free time (it waits for the shop again).' })
  @ApiConflictResponse({ description: 'That time is not free, or it is too late to move.' })
  move(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: MoveAppointmentDto,
  ): Promise<Appointment> {
    return this.appointments.move(user, id, body.start);
  }

  @Post(':id/accept-proposal')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: "Take the shop's proposed time: the appointment moves there, confirmed." })
  @ApiConflictResponse({ description: 'No proposal, or the proposed time is no longer free.' })
  accept(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.move(user, id, null);
  }

  @Post(':id/reject-proposal')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: "Turn the shop's proposal down; the request stays at its time." })
  reject(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Appointment> {
    return this.appointments.act(user, id, 'reject-proposal', 'rider');
  }
}
