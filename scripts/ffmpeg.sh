#!/usr/bin/env bash
# ffmpeg for series analysis (video decoding on the server and in the CLI, and the tests that
# encode generated frames). Sourced after lib.sh, not run.

# Installs Debian's ffmpeg (without recommended extras) when ffmpeg or ffprobe is missing.
ensure_ffmpeg() {
  if command -v ffmpeg >/dev/null && command -v ffprobe >/dev/null; then return; fi
  log "installing Debian package ffmpeg (video decoding for series analysis)"
  as_root env DEBIAN_FRONTEND=noninteractive apt-get update -qq
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends ffmpeg >/dev/null ||
    die "installing ffmpeg failed; install it by hand (apt-get install ffmpeg)"
  command -v ffmpeg >/dev/null || die "ffmpeg not found after installing it"
}
