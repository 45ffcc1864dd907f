import type { RegisterRequest } from '@loamline/shared-types';
import { EmailField, NameField, NewPasswordField } from '../../common/dto/fields';

export class RegisterDto implements RegisterRequest {
  @EmailField()
  email: string;

  @NewPasswordField()
  password: string;

  @NameField(100, 'Sam')
  name: string;
}
