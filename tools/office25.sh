#!/usr/bin/env bash
# A second office for the tests: LibreOffice 25.2 from Debian 12's backports suite,
# unpacked into .office25/ beside the system's 7.4, which stays as it is.
#
# Nothing is installed into the system: Debian 12 and its backports suite are read through a private
# apt configuration (its own source list, package lists and cache under .office25/apt/),
# so the system's apt never sees it and nothing is upgraded; the packages are fetched
# with `apt-get download` and unpacked with `dpkg-deb -x`.  Debian's build points a few
# paths at /usr/lib/libreoffice and /etc/libreoffice, which would be the system's 7.4
# files: those are turned to the unpacked tree.  The office's Python is still the
# system's python3 (3.11); its UNO bridge (uno.py, pyuno.so) is 25.2's own, from the
# program folder, which the office's Python loader puts first on sys.path.
#
# Safe to run again; prints the program folder.  Debian 12 (bookworm) only: elsewhere it
# says so and exits 1.  `make test` runs the office tests a second time on it, in a
# pytest process of their own whose `import uno` is this office's bridge (a process can
# hold one office's bridge only):
#   ECLIPSHEET_OFFICE=<program folder> PYTHONPATH=<program folder>:<its dist-packages>
#
# Where: as root, in a folder every user can enter (ECLIPSHEET_OFFICE25_STORE, by default
# /var/tmp/eclipsheet-office25), with .office25 a link to it.  The tests install the
# extension with unopkg run as 'nobody' (unopkg refuses a per-user install as root), and
# 'nobody' cannot reach an office inside a checkout that lies in a private folder (a
# mktemp -d folder is 0700).  An existing .office25 folder is used as it is.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -e .office25 ] && [ ! -L .office25 ] && [ "$(id -u)" -eq 0 ]; then
  store=${ECLIPSHEET_OFFICE25_STORE:-/var/tmp/eclipsheet-office25}
  mkdir -p "$store"
  chmod 755 "$store"
  ln -s "$store" .office25
fi
root=.office25
program=$root/root/usr/lib/libreoffice/program
if [ -x "$program/soffice.bin" ] && [ -f "$root/ready" ]; then
  realpath "$program"
  exit 0
fi
if ! grep -q 'VERSION_CODENAME=bookworm' /etc/os-release 2>/dev/null; then
  echo "office25: LibreOffice 25.2 from bookworm-backports needs Debian 12 (bookworm)" >&2
  exit 1
fi

# The office's own packages (one source package, libreoffice), as the backports suite
# has them; their other dependencies are Debian 12's own libraries.
packages=(libreoffice-core libreoffice-core-nogui libreoffice-common libreoffice-calc
          libreoffice-base-core libreoffice-script-provider-python libreoffice-style-colibre
          libreoffice-uiconfig-calc libreoffice-uiconfig-common fonts-opensymbol python3-uno
          ure uno-libs-private libuno-sal3 libuno-cppu3 libuno-cppuhelpergcc3-3
          libuno-purpenvhelpergcc3-3 libuno-salhelpergcc3-3)
# A library 25.2 needs that 7.4 did not, so the system may lack it: Debian 12's own.
plain=(libzxcvbn0)

rm -rf "$root/root" "$root/debs" "$root/ready"
mkdir -p "$root/apt/parts" "$root/apt/lists/partial" "$root/apt/cache/archives/partial" \
         "$root/debs" "$root/root"
cat > "$root/apt/parts/backports.sources" <<'EOF'
Types: deb
URIs: http://deb.debian.org/debian
Suites: bookworm bookworm-backports
Components: main
Signed-By: /usr/share/keyrings/debian-archive-keyring.gpg
EOF
private=(-o "Dir::Etc::SourceList=/dev/null" -o "Dir::Etc::SourceParts=$PWD/$root/apt/parts"
         -o "Dir::State::Lists=$PWD/$root/apt/lists" -o "Dir::Cache=$PWD/$root/apt/cache"
         -o "APT::Sandbox::User=root")
apt-get -q "${private[@]}" update >&2
(cd "$root/debs" && apt-get -q "${private[@]}" download \
   "${packages[@]/%//bookworm-backports}" >&2)
(cd "$root/debs" && apt-get -q "${private[@]}" download "${plain[@]/%//bookworm}" >&2)
for deb in "$root"/debs/*.deb; do
  dpkg-deb -x "$deb" "$root/root"
done

# The library beside the program (its run path is the program folder).
cp -a "$root"/root/usr/lib/x86_64-linux-gnu/libzxcvbn.so.0* "$program/"
# Paths that Debian's packaging points at the installed system: to the unpacked tree.
sed -i 's#^BRAND_BASE_DIR=file:///usr/lib/libreoffice#BRAND_BASE_DIR=${ORIGIN}/..#' \
  "$program/fundamentalrc"
sed -i 's#^FHS_CONFIG_FILE=file:///etc/libreoffice/sofficerc#FHS_CONFIG_FILE=${ORIGIN}/../../../../etc/libreoffice/sofficerc#' \
  "$program/sofficerc"
# unopkg's launcher puts the system office's program folder on PYTHONPATH: its own.
sed -i 's#^export PYTHONPATH="/usr/lib/libreoffice/program"#export PYTHONPATH="$sd_prog"#' \
  "$program/unopkg"
# Its uno.py points URE_BOOTSTRAP at /usr/lib/libreoffice, the system office: a client
# bridge from this office's pyuno would then read 7.4's types, and the office's answers
# (a 25.2 document model) would break the bridge.  Its own program folder instead.
sed -i "s#os.putenv('URE_BOOTSTRAP', 'vnd.sun.star.pathname:/usr/lib/libreoffice/program/fundamentalrc')#os.putenv('URE_BOOTSTRAP', 'vnd.sun.star.pathname:' + os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', '..', 'libreoffice', 'program', 'fundamentalrc'))#" \
  "$root/root/usr/lib/python3/dist-packages/uno.py"
grep -q "os.path.dirname(os.path.abspath(__file__))" "$root/root/usr/lib/python3/dist-packages/uno.py"
# The configuration that Debian's install script would copy to /etc.
ln -sfn ../.registry/main.xcd "$root/root/usr/lib/libreoffice/share/registry/main.xcd"
# Other links into /etc, /var or /usr/share: to their unpacked copies where there is one.
while IFS= read -r link; do
  target=$(readlink "$link")
  if [ -e "$root/root$target" ]; then
    ln -sfn "$(realpath --relative-to="$(dirname "$link")" "$root/root$target")" "$link"
  fi
done < <(find "$root/root" -type l -lname '/*')

version=$("$program/soffice" --version)
case "$version" in
  "LibreOffice 25.2"*) ;;
  *) echo "office25: the unpacked office says: $version" >&2; exit 1 ;;
esac
echo "$version" > "$root/ready"
realpath "$program"
