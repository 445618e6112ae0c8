# The JVM's options by the work, for tools/outstage and for the installed image's launcher (tools/package-image copies
# this file to the image's lib/). Sourced by bash; it defines three functions and runs nothing:
#   outstage_mode ARGS...                 sets `mode` to gui or cli for these command-line arguments
#   outstage_jvm_options MODE ARGS...     appends to the array `jvm` the compiler, collector and compilation options
#   outstage_run JAVA JAR CDS_DIR SAMPLE ARGS...
#                                         runs the application (with `jvm` and the class-data archive of `mode`)
# Every figure quoted is in docs/performance.md, measured on the 2-core build machine.

outstage_mode() {
  mode=cli
  case "${1:-}" in
    gui) mode=gui ;;
    # no command: the workbench when a display exists (as org.outstage.Launcher decides), else the bench job on the
    # command line, which must not record the workbench's archive
    "") if [ -n "${DISPLAY:-}" ] || [ -n "${WAYLAND_DISPLAY:-}" ]; then mode=gui; fi ;;
  esac
}

outstage_jvm_options() {
  local m=$1
  shift
  local cores
  cores=$(nproc 2>/dev/null || echo 4)
  # JIT mode by the work. The client compiler alone (C1) starts compiling sooner and leaves the second core to the
  # analysis; the optimising compiler (C2) is about 12 % faster per capture once warm, but only pays back after some
  # 300 MB of captures in one run: 120 two-second captures (35 MB) 2.27 s with C1 against 3.65 s with both compilers;
  # 600 captures (173 MB) 8.3 s against 9.0 s; 1200 captures (345 MB) about even; one 120 s, 96 kHz capture (35 MB)
  # 1.12 s against 1.23 s. So command-line runs of up to 256 MB of captures get C1; larger batches, `live` and `watch`
  # keep both compilers. The workbench gets C1 on a machine of at most two cores: there the optimising compiler took
  # the second core from the window's start and the first analysis (first render 1.3-1.7 s against 0.9-1.2 s with
  # C1; a capture opened later 0.23 s against 0.30 s warm).
  if [ "$m" = gui ] && [ "$cores" -le 2 ]; then jvm+=(-XX:TieredStopAtLevel=1); fi
  if [ "$m" = cli ]; then
    # the captures' total size, in one process for all of them (a stat per file cost a 120-file batch 0.2 s)
    local a bytes=0
    local paths=()
    for a in "$@"; do if [ -e "$a" ]; then paths+=("$a"); fi; done
    if [ ${#paths[@]} -gt 0 ]; then
      # the total is du's last line, "BYTES<tab>total", cut out by the shell rather than two more processes
      local sizes
      sizes=$(du -cbL -- "${paths[@]}" 2>/dev/null) || true
      bytes=${sizes##*$'\n'}
      bytes=${bytes%%[[:space:]]*}
    fi
    case "$bytes" in ''|*[!0-9]*) bytes=0 ;; esac
    # On a machine of at most two cores the serial collector: the 120-file batch 1.25 -> 1.18 s and 1.40 -> 1.29 s
    # in two runs, half the system time (the default collector starts with a small young generation and grows it
    # collection by collection); one capture no different. Larger machines keep the default.
    if [ "$cores" -le 2 ]; then jvm+=(-XX:+UseSerialGC); fi
    case "${1:-}" in
      live|watch) ;;   # long-running commands keep both compilers
      *) if [ "$bytes" -le $((256 * 1024 * 1024)) ]; then jvm+=(-XX:TieredStopAtLevel=1); fi ;;
    esac
  fi
  # Early compilation of our own classes and the FFT library: at the JVM's usual thresholds a method that runs once
  # per analysis over a long record (each pass over the samples, the FFT's bit reversal and first butterfly stage)
  # runs interpreted until an on-stack replacement takes over a single loop, and the FFT's first transforms of a
  # capture took 36-72 ms each against 4 ms once compiled. At 1/20 of the thresholds they are compiled after a few
  # calls or some 3,000 loop turns; the rest of the JVM (picocli, JavaFX, the JDK) keeps its thresholds. One 10 s,
  # 96 kHz capture: 0.37 s -> 0.29-0.30 s whole-process; 120 two-second captures: 1.47 s -> 1.33 s.
  # (`quiet` first: without it the JVM prints each CompileCommand on stdout, into the JSON.)
  jvm+=(-XX:CompileCommand=quiet "-XX:CompileCommand=CompileThresholdScaling,org.outstage.*::*,0.05"
        "-XX:CompileCommand=CompileThresholdScaling,org.jtransforms.*::*,0.05")
}

# Class-data sharing (JDK 13+ dynamic AppCDS): the first run after a build records the classes it loaded into an
# archive, CDS_DIR/outstage-MODE.jsa; later runs map it instead of loading and verifying those classes again. An
# archive older than the jar is recorded again. For command-line runs a short training run on the SAMPLE capture
# records the classes of the analysis path first, whatever is asked (a `--version` would record next to nothing); the
# workbench's archive is recorded at the first workbench's exit. OUTSTAGE_CDS=off runs without archives.
outstage_run() {
  local java=$1 jar=$2 cds=$3 sample=$4
  shift 4
  if [ "${OUTSTAGE_CDS:-on}" = off ]; then exec "$java" "${jvm[@]}" ${OUTSTAGE_JAVA_OPTS:-} -jar "$jar" "$@"; fi
  local archive="$cds/outstage-$mode.jsa"
  jvm+=(-Xlog:cds=off -Xlog:cds+dynamic=off)
  if [ -f "$archive" ] && [ "$archive" -nt "$jar" ]; then
    exec "$java" "${jvm[@]}" -XX:SharedArchiveFile="$archive" ${OUTSTAGE_JAVA_OPTS:-} -jar "$jar" "$@"
  fi
  # a folder we cannot write (an image installed read-only, moved, in a cache we cannot make): run without an archive
  if ! mkdir -p "$cds" 2>/dev/null || [ ! -w "$cds" ]; then exec "$java" "${jvm[@]}" ${OUTSTAGE_JAVA_OPTS:-} -jar "$jar" "$@"; fi
  local tmp="$archive.$$" rc
  set +e
  if [ "$mode" = cli ] && [ -f "$sample" ]; then
    "$java" "${jvm[@]}" -XX:ArchiveClassesAtExit="$tmp" -jar "$jar" analyze --json --fs-volts 40 --load 8 "$sample" >/dev/null 2>&1
    if [ -s "$tmp" ]; then mv -f "$tmp" "$archive"; else rm -f "$tmp"; fi
    set -e
    if [ -f "$archive" ]; then jvm+=(-XX:SharedArchiveFile="$archive"); fi
    exec "$java" "${jvm[@]}" ${OUTSTAGE_JAVA_OPTS:-} -jar "$jar" "$@"
  fi
  "$java" "${jvm[@]}" -XX:ArchiveClassesAtExit="$tmp" ${OUTSTAGE_JAVA_OPTS:-} -jar "$jar" "$@"
  rc=$?
  set -e
  if [ -s "$tmp" ]; then mv -f "$tmp" "$archive"; else rm -f "$tmp"; fi
  exit $rc
}
