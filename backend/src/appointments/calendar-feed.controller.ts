import { Controller, Get, Header, HttpCode, HttpStatus, Param, Post } from '@nestjs/common';
import {
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import { ApiSession } from '../common/decorators/api-session.decorator';
import { CurrentUser, type RequestUser } from '../common/decorators/current-user.decorator';
import { Public } from '../common/decorators/public.decorator';
import { Roles } from '../common/decorators/roles.decorator';
import { NotFoundError } from '../common/errors/domain-errors';
import { staffShopId } from '../common/staff-shop';
import { CalendarFeedService } from './calendar-feed.service';

/** The shop's private schedule feed for calendar apps, and the owner's button that renews its URL. */
@Controller()
export class CalendarFeedController {
  constructor(private readonly feeds: CalendarFeedService) {}

  @Post('workshop/calendar-feed')
  @ApiTags('workshop')
  @ApiSession()
  @Roles('owner')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'A new secret feed URL for the shop’s schedule; the old one stops working.' })
  @ApiForbiddenResponse({ description: 'Not the owner of a shop.' })
  @ApiOkResponse({ description: '`{ url }`' })
  renew(@CurrentUser() user: RequestUser): Promise<{ url: string }> {
    return this.feeds.renew(staffShopId(user));
  }

  @Get('calendar/:slug/:file')
  @Public()
  @ApiTags('workshop')
  @Header('Content-Type', 'text/calendar; charset=utf-8')
  @Header('Cache-Control', 'private, no-store')
  @ApiOperation({ summary: 'The shop’s schedule as ICS (RFC 5545), for the holder of the secret URL.' })
  @ApiNotFoundResponse({ description: 'No such feed (or the URL was renewed).' })
  feed(@Param('slug') slug: string, @Param('file') file: string): Promise<string> {
    const m = /^([A-Za-z0-9_-]{20,100})\.ics$/.exec(file);
    if (!m) throw new NotFoundError('No such calendar.');
    return this.feeds.feed(slug, m[1]);
  }
}
