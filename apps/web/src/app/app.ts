import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterOutlet } from '@angular/router';
import { Shell } from './shell/shell';

/** The root component: the shell around whichever section the router shows. */
@Component({
  selector: 'lw-root',
  imports: [RouterOutlet, Shell],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<lw-shell><router-outlet /></lw-shell>`,
})
export class App {}
