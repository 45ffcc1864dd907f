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
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Bike } from '@loamline/shared-types';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { BikesService } from './bikes.service';
import { BikeView } from './dto/bike-view';
import { CreateBikeDto, UpdateBikeDto } from './dto/create-bike.dto';

/** An id in the path: a malformed one is just "not found", like another user's. */
const uuid = new ParseUUIDPipe({ errorHttpStatusCode: HttpStatus.NOT_FOUND });

/** The signed-in user's garage. */
@ApiTags('garage')
@ApiSession()
@Controller('bikes')
export class BikesController {
  constructor(private readonly bikes: BikesService) {}

  @Get()
  @ApiOperation({ summary: 'My bikes, oldest first.' })
  @ApiOkResponse({ type: [BikeView] })
  list(@CurrentUser() user: RequestUser): Promise<Bike[]> {
    return this.bikes.list(user);
  }

  @Post()
  @ApiOperation({ summary: 'Add a bike with its fork and shock specs (either may be null).' })
  @ApiCreatedResponse({ type: BikeView })
  @ApiBadRequestResponse({ description: 'A field is missing or out of range (named in `fields`).' })
  @ApiConflictResponse({ description: 'The garage is full.' })
  create(@CurrentUser() user: RequestUser, @Body() body: CreateBikeDto): Promise<Bike> {
    return this.bikes.create(user, body);
  }

  @Get(':id')
  @ApiOperation({ summary: 'One of my bikes.' })
  @ApiOkResponse({ type: BikeView })
  @ApiNotFoundResponse({ description: 'No such bike, or not mine.' })
  get(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<Bike> {
    return this.bikes.get(user, id);
  }

  @Patch(':id')
  @ApiOperation({
    summary:
      "Change the name or a part; a part sent replaces the stored one whole, except its measured spring (a shop's fit): left out it is kept, null removes it, and only the stored one may be sent back.",
  })
  @ApiOkResponse({ type: BikeView })
  @ApiBadRequestResponse({ description: 'A field is out of range (named in `fields`).' })
  @ApiNotFoundResponse({ description: 'No such bike, or not mine.' })
  update(
    @CurrentUser() user: RequestUser,
    @Param('id', uuid) id: string,
    @Body() body: UpdateBikeDto,
  ): Promise<Bike> {
    return this.bikes.update(user, id, body);
  }

  @Delete(':id')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Remove a bike (saved baseline sheets keep their own copy of its specs).' })
  @ApiNoContentResponse({ description: 'Removed.' })
  @ApiNotFoundResponse({ description: 'No such bike, or not mine.' })
  async remove(@CurrentUser() user: RequestUser, @Param('id', uuid) id: string): Promise<void> {
    await this.bikes.remove(user, id);
  }
}
