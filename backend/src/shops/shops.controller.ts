import { Controller, Get, Param, Query, Res } from '@nestjs/common';
import type { Response } from 'express';
import { ApiNotFoundResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { ShopDetail, ShopSummary } from '@loamline/shared-types';
import { AppointmentsService } from '../appointments/appointments.service';
import { AvailabilityQueryDto } from '../appointments/dto/appointment.dto';
import { Public } from '../common/decorators/public.decorator';
import { NotFoundError } from '../common/errors/domain-errors';
import { ShopServicesService } from '../shop-services/shop-services.service';
import { ShopsService } from './shops.service';

/** The shops riders can book, their services and free times (no sign-in). */
@ApiTags('shops')
@Public()
@Controller('shops')
export class ShopsController {
  constructor(
    private readonly shops: ShopsService,
    private readonly services: ShopServicesService,
    private readonly appointments: AppointmentsService,
  ) {}

  @Get()
  @ApiOperation({ summary: 'Every shop, by name.' })
  @ApiOkResponse({ description: 'ShopSummary[]' })
  async list(): Promise<ShopSummary[]> {
    return (await this.shops.listAll()).map((s) => this.shops.toSummary(s));
  }

  @Get(':slug')
  @ApiOperation({ summary: 'A shop with its active services and booking rules.' })
  @ApiNotFoundResponse({ description: 'No such shop.' })
  async get(@Param('slug') slug: string): Promise<ShopDetail> {
    const shop = await this.shops.findBySlug(slug);
    if (!shop) throw new NotFoundError('No such shop.');
    return {
      ...this.shops.toSummary(shop),
      services: await this.services.list(shop.id, true),
      cancellationWindowHours: shop.cancellationWindowHours,
      minNoticeMinutes: shop.minNoticeMinutes,
      maxDaysAhead: shop.maxDaysAhead,
    };
  }

  @Get(':slug/availability')
  @ApiOperation({ summary: 'Free starts for a service between two local dates (the shop zone), per bench.' })
  @ApiOkResponse({ description: '[{ start, end, benchesFree }], ISO-8601 with the shop zone offset' })
  // AvailableStart[], sent as the JSON text the answer was serialized to once (availability-cache.ts)
  async availability(
    @Param('slug') slug: string,
    @Query() q: AvailabilityQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const json = await this.appointments.availabilityJson(slug, q.serviceId, q.from, q.to);
    res.type('application/json');
    return json;
  }
}
