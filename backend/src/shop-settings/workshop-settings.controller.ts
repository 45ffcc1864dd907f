import { Body, Controller, Get, Put } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { ShopSettings } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { staffShopId } from '../common/staff-shop';
import { ShopSettingsDto } from './dto/shop-settings.dto';
import { ShopSettingsService } from './shop-settings.service';

/** Workshop › Hours & rules: any staff may read them, the owner changes them. */
@ApiTags('workshop')
@ApiSession()
@ApiForbiddenResponse({ description: 'Not staff of a shop (or, to change them, not its owner).' })
@Roles('technician', 'owner')
@Controller('workshop/settings')
export class WorkshopSettingsController {
  constructor(private readonly settings: ShopSettingsService) {}

  @Get()
  @ApiOperation({ summary: "The shop's time zone, currency, benches, hours, closures and booking rules." })
  @ApiOkResponse({ type: ShopSettingsDto })
  get(@CurrentUser() user: RequestUser): Promise<ShopSettings> {
    return this.settings.get(staffShopId(user));
  }

  @Put()
  @Roles('owner')
  @ApiOperation({ summary: 'Replace the settings as a whole (checked: zone, grid, overlaps, dates).' })
  @ApiOkResponse({ type: ShopSettingsDto })
  @ApiBadRequestResponse({ description: 'A rule is broken; `fields` names each one.' })
  put(@CurrentUser() user: RequestUser, @Body() body: ShopSettingsDto): Promise<ShopSettings> {
    return this.settings.put(staffShopId(user), body);
  }
}
