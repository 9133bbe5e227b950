import { ChangeDetectionStrategy, Component } from '@angular/core';

/** A page with nothing on it, for routes a spec needs to exist but not to show anything. */
@Component({
  selector: 'sm-blank-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
})
export class BlankPage {}
