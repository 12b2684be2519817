/**
 * The device pixel ratio, kept current (zoom, a move to another screen) through a media query on the
 * ratio itself. Create in a component's script: it watches for as long as the component lives.
 */
export class PixelRatio {
  value = $state(typeof window === 'undefined' ? 1 : window.devicePixelRatio || 1);

  constructor() {
    $effect(() => {
      let media: MediaQueryList | null = null;
      const watch = (): void => {
        media?.removeEventListener('change', watch);
        this.value = window.devicePixelRatio || 1;
        media = window.matchMedia(`(resolution: ${this.value}dppx)`);
        media.addEventListener('change', watch);
      };
      watch();
      return () => media?.removeEventListener('change', watch);
    });
  }
}
