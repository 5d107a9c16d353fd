import { Global, Module } from '@nestjs/common';
import { LiveGateway } from './live.gateway.js';
import { LiveService } from './live.service.js';
import { LiveController } from './live.controller.js';

@Global()
@Module({ providers: [LiveGateway, LiveService], controllers: [LiveController], exports: [LiveService] })
export class LiveModule {}
