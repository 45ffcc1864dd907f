import { ApiProperty } from '@nestjs/swagger';
import { IsString, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MAX_LENGTH, type SignInRequest } from '@loamline/shared-types';
import { EmailField } from '../../common/dto/fields';

export class SignInDto implements SignInRequest {
  @EmailField()
  email: string;

  /** not checked against the length rules: an old password may predate them */
  @ApiProperty({ format: 'password' })
  @IsString()
  @MinLength(1, { message: 'must not be empty' })
  @MaxLength(PASSWORD_MAX_LENGTH)
  password: string;
}
