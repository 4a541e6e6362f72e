/**
 * URIs a hostile or careless file may put in `buffers[].uri` or `images[].uri` to make a reader
 * open something outside the asset's folder: parent segments (plain and percent-encoded), absolute
 * paths, drive letters, UNC shares, backslashes, NUL, and schemes (`file:`, `http:` and others).
 * Also a few that look odd but stay inside the folder, so the checks cannot pass by refusing all.
 */

/** The file name every climbing URI aims at; tests place canaries with this name outside the folder. */
export const CANARY_NAME = 'canary.bin';

/** A URI and whether it can only name something outside the asset's folder. */
export interface HostileUri {
  uri: string;
  isOutside: boolean;
}

/**
 * The hostile URIs. `absoluteTargets` are absolute paths of canary files the caller placed
 * outside the folder (e.g. `/tmp/orientry-fuzz-x/canary.bin`); each is also tried as a `file:` URL.
 */
export function hostileUris(absoluteTargets: readonly string[] = []): HostileUri[] {
  const outside = (uri: string): HostileUri => ({ uri, isOutside: true });
  const inside = (uri: string): HostileUri => ({ uri, isOutside: false });
  const climbs: HostileUri[] = [];
  for (let depth = 1; depth <= 8; depth++) {
    climbs.push(outside(`${'../'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`${'%2e%2e/'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`${'..%2f'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`${'..%2F'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`sub/${'../'.repeat(depth + 1)}${CANARY_NAME}`));
    climbs.push(outside(`${'..\\'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`${'..%5c'.repeat(depth)}${CANARY_NAME}`));
    climbs.push(outside(`./${'.././'.repeat(depth)}${CANARY_NAME}`));
  }
  const absolute = absoluteTargets.flatMap((target) => [
    outside(target),
    outside(`file://${target}`),
    outside(`file:${target}`),
    outside(`FILE://localhost${target}`),
    outside(encodeURIComponent(target)),
    outside(`%2f${target.slice(1)}`),
    outside(`/${target}`),
    outside(`//${target}`)
  ]);
  return [
    ...climbs,
    ...absolute,
    outside('/etc/passwd'),
    outside('/proc/self/environ'),
    outside('/dev/zero'),
    outside('/dev/urandom'),
    outside('file:///etc/passwd'),
    outside('file:///dev/zero'),
    outside('file://host/share/canary.bin'),
    outside('http://127.0.0.1:9/canary.bin'),
    outside('https://orientry-fuzz.invalid/canary.bin'),
    outside('HTTP://127.0.0.1/canary.bin'),
    outside('ftp://127.0.0.1/canary.bin'),
    outside('javascript:alert(1)'),
    outside('blob:http://127.0.0.1/canary'),
    outside('C:\\Windows\\win.ini'),
    outside('c:/windows/win.ini'),
    outside('C:canary.bin'),
    outside('\\\\server\\share\\canary.bin'),
    outside('//server/share/canary.bin'),
    outside('~/.ssh/id_rsa'.replace('~', '/root')),
    outside('%00../canary.bin'),
    outside('canary.bin\u0000.png'),
    outside('canary.bin%00.png'),
    outside('..'),
    outside('../'),
    outside('%2e%2e'),
    outside('.%2e/canary.bin'),
    outside('%2e./canary.bin'),
    outside('%c0%ae%c0%ae/canary.bin'),
    outside('%'),
    outside('%zz/canary.bin'),
    outside(''),
    outside('.'),
    outside('./'),
    outside('sub/..'),
    outside('#fragment'),
    outside('?query'),
    // These stay inside the folder: a reader may ask for them (they are then simply missing).
    inside('\uff0e\uff0e/canary.bin'),
    inside('\u2025/canary.bin'),
    inside('...canary.bin'),
    inside('..canary.bin'),
    inside('sub/../canary.bin'),
    inside('canary.bin?../../etc/passwd'),
    inside('canary.bin#../../etc/passwd'),
    inside('a%2fb.bin'),
    inside('%E2%80%AE.bin'),
    inside(`${'deep/'.repeat(200)}canary.bin`),
    inside(`${'x'.repeat(5000)}.bin`)
  ];
}
