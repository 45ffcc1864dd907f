import { Body, Controller, Get, Param, Post, Req, Res } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { InvitationLookup, RegisterResponse } from '@loamline/shared-types';
import { RegisterResponseView } from '../auth/dto/auth-views';
import { SessionService } from '../auth/session.service';
import { Public } from '../common/decorators/public.decorator';
import { AuthRateLimit } from '../common/decorators/rate-limit.decorator';
import { UsersService } from '../users/users.service';
import { AcceptInvitationDto } from './dto/create-invitation.dto';
import { InvitationLookupView } from './dto/team-views';
import { TeamService } from './team.service';

/** The join page's routes: anyone holding the e-mailed token (no account yet). */
@ApiTags('workshop')
@Public()
@Controller('invitations')
export class InvitationsController {
  constructor(
    private readonly team: TeamService,
    private readonly sessions: SessionService,
    private readonly users: UsersService,
  ) {}

  // Not rate-limited: the join page may ask again on every focus, and a 256-bit token is not guessable.
  @Get(':token')
  @ApiOperation({ summary: 'Which shop invites which address, for the join page.' })
  @ApiOkResponse({ type: InvitationLookupView })
  @ApiNotFoundResponse({ description: 'Unknown, used, replaced or expired.' })
  async lookup(@Param('token') token: string): Promise<InvitationLookup> {
    return this.team.lookup(token);
  }

  @Post('accept')
  @AuthRateLimit()
  @ApiOperation({ summary: 'Create the invited staff account and sign in (sets the session cookie).' })
  @ApiCreatedResponse({ type: RegisterResponseView })
  @ApiBadRequestResponse({ description: 'A field is missing or malformed.' })
  @ApiNotFoundResponse({ description: 'The invitation is unknown, used, replaced or expired.' })
  @ApiConflictResponse({ description: 'The address got an account in the meantime.' })
  async accept(
    @Body() body: AcceptInvitationDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<RegisterResponse> {
    const user = await this.team.accept(body.token, body.name, body.password);
    await this.sessions.signIn(req, res, user);
    return { user: this.users.toAuthUser(user) };
  }
}
