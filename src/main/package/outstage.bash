#!/usr/bin/env bash
# Outstage, the installed image's launcher on Linux (tools/package-image puts it in bin/outstage): the bundled Java
# runtime with the options that suit the work, by the same rules as tools/outstage (lib/launch-options.bash), and the
# class-data archive of the application's classes when the image has one. It replaces jpackage's own Linux launcher,
# which cannot choose its options by the work and asks the package managers about itself on every start (about
# 0.1 s; docs/performance.md, "The installed image").
#   outstage                 workbench on the bundled sample session when a display exists, otherwise the sample
#                            captures analysed on the command line
#   outstage <command> ...   any command; see outstage --help
set -euo pipefail
app="$(cd "$(dirname "$(readlink -f "${BASH_SOURCE[0]}")")/.." && pwd -P)"
# the bundled sample session, for the run without a command
export OUTSTAGE_HOME="${OUTSTAGE_HOME:-$app/share}"
jvm=(-Djavafx.cachedir="${XDG_CACHE_HOME:-${HOME:-/tmp}/.cache}/outstage-javafx")
source "$app/lib/launch-options.bash"
outstage_mode "$@"
outstage_jvm_options "$mode" "$@"
# Class-data archives (outstage_run): those recorded when the image was built, in lib/app; in an image copied or moved
# since (they name the old place, and the JVM would silently ignore them) this user's own, recorded in the cache on
# the first runs here
cds="$app/lib/app"
if [ "$(cat "$app/lib/app/built-in" 2>/dev/null)" != "$app" ]; then
  cds="${XDG_CACHE_HOME:-${HOME:-/tmp}/.cache}/outstage/cds-$(printf '%s' "$app" | cksum | cut -d' ' -f1)"
fi
outstage_run "$app/lib/runtime/bin/java" "$app/lib/app/outstage.jar" "$cds" "$app/share/sample-captures/da60-level-020W.wav" "$@"
