import { Body, Controller, Get, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { InvitationView, TeamResponse } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { CreateInvitationDto } from './dto/create-invitation.dto';
import { InvitationViewDoc, TeamResponseView } from './dto/team-views';
import { TeamService } from './team.service';

/** Workshop › Team: the shop's staff (any staff may look) and invitations (owner only). */
@ApiTags('workshop')
@ApiSession()
@ApiForbiddenResponse({ description: 'Not staff of a shop (or, for invitations, not its owner).' })
@Roles('technician', 'owner')
@Controller('workshop/team')
export class TeamController {
  constructor(private readonly team: TeamService) {}

  @Get()
  @ApiOperation({ summary: "The shop's staff and the invitations not yet used." })
  @ApiOkResponse({ type: TeamResponseView })
  list(@CurrentUser() user: RequestUser): Promise<TeamResponse> {
    return this.team.team(user);
  }

  @Post('invitations')
  @Roles('owner')
  @ApiOperation({
    summary:
      'Invite someone by e-mail to join the shop as technician or owner (the mail goes out through the outbox).',
  })
  @ApiCreatedResponse({ type: InvitationViewDoc })
  @ApiBadRequestResponse({ description: 'The address or role is malformed.' })
  @ApiConflictResponse({ description: 'The address already has an account.' })
  invite(@CurrentUser() owner: RequestUser, @Body() body: CreateInvitationDto): Promise<InvitationView> {
    return this.team.invite(owner, body.email, body.role);
  }
}
