import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches } from 'class-validator';
import type { PasswordResetConfirmRequest, PasswordResetRequest } from '@loamline/shared-types';
import { EmailField, NewPasswordField } from '../../common/dto/fields';

export class PasswordResetRequestDto implements PasswordResetRequest {
  @EmailField()
  email: string;
}

/** A link token as `newLinkToken()` makes them: 43 base64url characters. */
export const LINK_TOKEN = /^[A-Za-z0-9_-]{43}$/;

export class PasswordResetConfirmDto implements PasswordResetConfirmRequest {
  @ApiProperty({ description: 'the token from the e-mailed link `/reset-password?token=…`' })
  @IsString()
  @Matches(LINK_TOKEN, { message: 'is not a reset token' })
  token: string;

  @NewPasswordField()
  password: string;
}
