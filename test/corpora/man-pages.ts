import { execFile } from 'node:child_process';
import { existsSync, lstatSync, readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { promisify } from 'node:util';
import { gunzipSync } from 'node:zlib';
import { cached, evenlySpaced, squeeze, type DevCorpus, type LabelledDoc, unpackedDebianPackage } from './labelled-corpus';

const run = promisify(execFile);
const SECTIONS = ['1', '2', '3', '5', '7', '8'];
const PER_SECTION = 170;

/**
 * The Debian packages whose pages make the corpus: the man-pages project (sections 2, 3, 5, 7)
 * and a fixed set of base-system, network, storage and mail packages for commands (1), file
 * formats (5) and administration (8). They are unpacked with `apt-get download` + `dpkg -x`,
 * not installed, so the corpus is the same on every machine whatever else is installed there
 * (until 2026-12-02 it read /usr/share/man, and two machines gave man pages P@10 that differed
 * by 0.005).
 */
const PACKAGES = [
  'manpages', 'manpages-dev', 'coreutils', 'util-linux', 'procps', 'iproute2', 'e2fsprogs', 'findutils',
  'grep', 'sed', 'tar', 'gzip', 'bash', 'dpkg', 'apt', 'systemd', 'openssh-client', 'openssh-server',
  'git', 'man-db', 'passwd', 'login', 'mount', 'kmod', 'rsync', 'curl', 'wget', 'less', 'diffutils',
  'sudo', 'iptables', 'lvm2', 'cron', 'logrotate', 'nftables', 'xfsprogs', 'btrfs-progs', 'dosfstools',
  'parted', 'net-tools', 'iputils-ping', 'ethtool', 'cryptsetup-bin', 'mdadm', 'postfix', 'rsyslog',
  'nfs-common', 'mutt', 'fontconfig-config', 'initramfs-tools-core', 'adduser', 'dnsmasq-base',
  'isc-dhcp-client', 'autofs', 'sysstat', 'quota',
];

/** A page that only points at another (a symlink, or a `.so` request) would repeat that page. */
function isAlias(file: string): boolean {
  if (lstatSync(file).isSymbolicLink()) return true;
  const head = gunzipSync(readFileSync(file)).toString('latin1', 0, 200);
  return /^\.so\s/m.test(head.replace(/^\.\\".*$/gm, '').trimStart());
}

/**
 * Manual pages rendered as a reader sees them (man-db, 100 columns, no hyphenation), labelled by
 * section (1 commands, 2 system calls, 3 library functions, 5 file formats, 7 overviews,
 * 8 administration), 170 pages a section, evenly spaced by page name over the pages of PACKAGES
 * (aliases left out, a name met twice kept once).
 */
export const MAN_PAGES: DevCorpus = {
  name: 'man-pages',
  genre: 'technical manuals',
  role: 'TUNE',
  source: `Debian manpages, manpages-dev and ${PACKAGES.length - 2} base packages (unpacked, not installed), rendered by man-db; label = section`,
  missing: 'apt-get install man-db (the pages are unpacked from `apt-get download`)',
  available: () => existsSync('/usr/bin/man'),
  load: () =>
    cached('man-pages', async () => {
      const jobs: Array<{ file: string; label: string }> = [];
      const roots = PACKAGES.map((p) => path.join(unpackedDebianPackage(p), 'usr', 'share', 'man'));
      for (const s of SECTIONS) {
        const pages = new Map<string, string>();
        for (const root of roots) {
          const dir = path.join(root, `man${s}`);
          if (!existsSync(dir)) continue;
          for (const f of readdirSync(dir)) {
            const file = path.join(dir, f);
            if (f.endsWith('.gz') && !pages.has(f) && !isAlias(file)) pages.set(f, file);
          }
        }
        const names = [...pages.keys()].sort();
        for (const f of evenlySpaced(names, PER_SECTION)) jobs.push({ file: pages.get(f)!, label: s });
      }
      const docs: Array<LabelledDoc | null> = new Array(jobs.length).fill(null);
      let next = 0;
      const worker = async (): Promise<void> => {
        while (next < jobs.length) {
          const i = next++;
          try {
            const { stdout } = await run('/usr/bin/man', ['--no-hyphenation', '--no-justification', '-l', jobs[i]!.file], {
              env: { ...process.env, MANWIDTH: '100', MAN_KEEP_FORMATTING: '', LC_ALL: 'C.UTF-8' },
              maxBuffer: 1 << 26,
            });
            // Overstrike bold/underline (x\bx, _\bx) to plain characters, as col -b does.
            const text = squeeze(stdout.replace(/.\x08/g, ''));
            if (text.length > 0) docs[i] = { text, label: jobs[i]!.label };
          } catch {
            // A page man cannot render is left out.
          }
        }
      };
      await Promise.all([worker(), worker()]);
      return docs.filter((d): d is LabelledDoc => d !== null);
    }),
};
