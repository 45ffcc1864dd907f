import { Body, Controller, Get, HttpCode, HttpStatus, Post, Req, Res } from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { AuthUser, RegisterResponse, SignInResponse } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Public } from '../common/decorators/public.decorator';
import { AuthRateLimit } from '../common/decorators/rate-limit.decorator';
import { UsersService } from '../users/users.service';
import { AuthService } from './auth.service';
import { PasswordResetConfirmDto, PasswordResetRequestDto } from './dto/password-reset.dto';
import { RegisterDto } from './dto/register.dto';
import { SignInDto } from './dto/sign-in.dto';
import { AuthUserView, RegisterResponseView, SignInResponseView } from './dto/auth-views';
import { SessionService } from './session.service';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    private readonly sessions: SessionService,
    private readonly users: UsersService,
  ) {}

  @Post('register')
  @Public()
  @AuthRateLimit()
  @ApiOperation({ summary: 'Create a rider account and sign in (sets the session cookie).' })
  @ApiCreatedResponse({ type: RegisterResponseView })
  @ApiBadRequestResponse({ description: 'A field is missing or malformed (named in `fields`).' })
  @ApiConflictResponse({ description: 'The e-mail address already has an account.' })
  async register(
    @Body() body: RegisterDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<RegisterResponse> {
    const user = await this.auth.register(body.email, body.password, body.name);
    await this.sessions.signIn(req, res, user);
    return { user: this.users.toAuthUser(user) };
  }

  @Post('sign-in')
  @Public()
  @AuthRateLimit()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Sign in: sets the session cookie and returns the same token for Bearer use.' })
  @ApiOkResponse({ type: SignInResponseView })
  @ApiBadRequestResponse({ description: 'A field is missing or malformed.' })
  @ApiUnauthorizedResponse({ description: 'The address and password do not match an account.' })
  async signIn(
    @Body() body: SignInDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SignInResponse> {
    const user = await this.auth.checkSignIn(body.email, body.password);
    const accessToken = await this.sessions.signIn(req, res, user);
    return { user: this.users.toAuthUser(user), accessToken };
  }

  @Post('sign-out')
  @Public()
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({
    summary: 'Sign out: ends this session on the server (its token stops working) and clears the cookie.',
  })
  @ApiNoContentResponse({ description: 'Signed out.' })
  async signOut(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.sessions.signOut(req, res);
  }

  @Post('sign-out-everywhere')
  @ApiSession()
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: "Sign out on every browser and client: all of the user's sessions end." })
  @ApiNoContentResponse({ description: 'Every session ended.' })
  async signOutEverywhere(
    @CurrentUser() user: RequestUser,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    await this.sessions.signOutEverywhere(req, res, user.id);
  }

  @Get('me')
  @ApiSession()
  @ApiOperation({ summary: 'Who is signed in.' })
  @ApiOkResponse({ type: AuthUserView })
  me(@CurrentUser() user: RequestUser): AuthUser {
    const { id, email, name, role, shopId } = user;
    return { id, email, name, role, shopId };
  }

  @Post('password-reset')
  @Public()
  @AuthRateLimit()
  @HttpCode(HttpStatus.ACCEPTED)
  @ApiOperation({
    summary: 'E-mail a password-reset link, if the address has an account (no hint either way).',
  })
  @ApiAcceptedResponse({ description: 'Accepted, whether or not the address has an account.' })
  @ApiBadRequestResponse({ description: 'The address is malformed.' })
  async requestPasswordReset(
    @Body() body: PasswordResetRequestDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    const received = (res.locals as { receivedAt?: unknown }).receivedAt;
    await this.auth.requestPasswordReset(body.email, typeof received === 'number' ? received : undefined);
  }

  @Post('password-reset/confirm')
  @Public()
  @AuthRateLimit()
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Set a new password with the e-mailed token; ends every older session.' })
  @ApiNoContentResponse({ description: 'The password is changed; sign in with it.' })
  @ApiBadRequestResponse({
    description: 'The token is malformed, used or expired, or the password too short.',
  })
  async confirmPasswordReset(@Body() body: PasswordResetConfirmDto): Promise<void> {
    await this.auth.confirmPasswordReset(body.token, body.password);
  }
}
