import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
} from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { ShopService } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { staffShopId } from '../common/staff-shop';
import { CreateShopServiceDto, UpdateShopServiceDto } from './dto/shop-service.dto';
import { ShopServicesService } from './shop-services.service';

const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** Workshop › Services: staff read the list, the owner changes it. */
@ApiTags('workshop')
@ApiSession()
@ApiForbiddenResponse({ description: 'Not staff of a shop (or, to change services, not its owner).' })
@Roles('technician', 'owner')
@Controller('workshop/services')
export class WorkshopServicesController {
  constructor(private readonly services: ShopServicesService) {}

  @Get()
  @ApiOperation({ summary: "The shop's services, active and retired." })
  @ApiOkResponse({ type: [CreateShopServiceDto] })
  list(@CurrentUser() user: RequestUser): Promise<ShopService[]> {
    return this.services.list(staffShopId(user), false);
  }

  @Post()
  @Roles('owner')
  @ApiOperation({ summary: 'Add a service.' })
  @ApiCreatedResponse({ type: CreateShopServiceDto })
  @ApiBadRequestResponse({ description: 'A field is out of range; `fields` names it.' })
  create(@CurrentUser() user: RequestUser, @Body() body: CreateShopServiceDto): Promise<ShopService> {
    return this.services.create(staffShopId(user), body);
  }

  @Patch(':id')
  @Roles('owner')
  @ApiOperation({ summary: 'Change a service (prices of booked appointments stay as booked).' })
  @ApiOkResponse({ type: CreateShopServiceDto })
  @ApiNotFoundResponse({ description: 'No such service at this shop.' })
  update(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: UpdateShopServiceDto,
  ): Promise<ShopService> {
    return this.services.update(staffShopId(user), id, body);
  }

  @Delete(':id')
  @Roles('owner')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Remove a service; one that was ever booked is retired instead.' })
  @ApiNoContentResponse()
  @ApiNotFoundResponse({ description: 'No such service at this shop.' })
  async remove(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<void> {
    await this.services.remove(staffShopId(user), id);
  }
}
