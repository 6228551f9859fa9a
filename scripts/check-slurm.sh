#!/usr/bin/env bash
# check-slurm.sh -- the README's Slurm job array on a real single-node cluster
#
#   bash scripts/check-slurm.sh        (make test-slurm; part of make check)
#
# Installs Debian's Slurm and munge when missing (scripts/install-deps.sh
# --slurm), starts munged, slurmctld and slurmd as this test's own processes
# with their configuration, key, sockets, state and logs in a temporary
# directory (free ports, nothing of the system's configuration used), then:
#   1. submits the job script of the README (section "Sharding and parallel
#      runs", taken from README.md itself, the shard count 16 made 4) for
#      lua/recipes/sharded_scan.lua with BRAKELIGHT_SMALL=1 through the
#      README's own submit and merge commands, and compares the merged table
#      record for record with an unsharded run;
#   2. the same for tests/slurm/slow_scan.lua (slow points): cancels array
#      task 2 while it computes (scancel JOB_2), checks that its shard file
#      kept a part of its points and that --merge refuses the incomplete
#      set, resubmits that task alone (--array=2), merges, and checks every
#      point is there exactly once, equal to an unsharded run.
# The daemons are stopped by their PIDs and the directory is removed on any
# exit.  A machine that cannot run the daemons (not root and no password-less
# sudo, packages not installable, a daemon that does not start) is not a
# failure: the script says why, prints "test-slurm: skipped" and exits 0.
# Needs build/brakelight (make all).  About 15 s when it runs.
set -euo pipefail

cd "$(dirname "$0")/.."
tree=$PWD
N=4                       # shards of each test job (the README says 16)
WAIT_SECS=60              # longest wait for one job array
start=$(date +%s)

say()  { echo "test-slurm: $*"; }
skip() { say "skipped: $*"; exit 0; }
fail() {
  say "FAIL: $*" >&2
  if [ -n "${T:-}" ]; then
    for f in "$T"/log/*.log "$T"/jobcomp.txt "$T"/w*/logs/*.log; do
      [ -s "$f" ] || continue
      echo "---- ${f#"$T"/} (last lines)" >&2; tail -n 15 "$f" >&2
    done
  fi
  exit 1
}

[ -x build/brakelight ] || fail "build/brakelight is missing (run make all first)"

# ---- can this machine run the daemons? ---------------------------------------
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
    say "not root: running again under sudo"
    exec sudo -n env PATH="$PATH" bash "$tree/scripts/check-slurm.sh"
  fi
  if command -v sudo >/dev/null 2>&1; then why="sudo asks for a password"
  else why="sudo is not installed"; fi
  skip "not root (uid $(id -u)) and $why: munged, slurmctld and slurmd must run as root"
fi
if ! out=$(bash scripts/install-deps.sh --slurm </dev/null 2>&1); then
  printf '%s\n' "$out" | tail -n 5
  skip "the Debian packages slurmctld, slurmd, slurm-client and munge could not be installed (install-deps.sh --slurm failed, output above)"
fi
for c in munged slurmctld slurmd sbatch squeue scancel scontrol sinfo; do
  command -v "$c" >/dev/null 2>&1 || PATH="$PATH:/usr/sbin:/sbin"
  command -v "$c" >/dev/null 2>&1 || skip "'$c' not found after installing the packages"
done

# no Slurm setting of an enclosing job may leak into the test's commands
for v in $(compgen -v SLURM_ || true); do unset "$v"; done
unset BRAKELIGHT_SHARDS BRAKELIGHT_SMALL BL_SLOW_POINT_SECS || true

# ---- the cluster ---------------------------------------------------------------
T=$(mktemp -d "${TMPDIR:-/tmp}/bl-slurm.XXXXXX")
# munged wants every directory above its socket searchable by all
chmod 755 "$T"
mkdir -p "$T/key" "$T/sock" "$T/log" "$T/state" "$T/spool"
chmod 700 "$T/key"
pids=()          # munged, slurmctld, slurmd, in the order started
submitted=       # set once a job may be on the cluster

cleanup() {
  local st=$? p i
  trap - EXIT INT TERM
  # jobs left on this cluster (a failure half-way) end first, so that no
  # slurmstepd outlives its slurmd
  local left=()
  [ -n "$submitted" ] && mapfile -t left < <(squeue -h -o %A 2>/dev/null)
  if [ ${#left[@]} -gt 0 ]; then
    scancel "${left[@]}" 2>/dev/null || true
    for i in $(seq 40); do
      [ -z "$(squeue -h -o %A 2>/dev/null)" ] && break; sleep 0.25
    done
  fi
  # stop in reverse order: slurmd, slurmctld, munged
  for (( i=${#pids[@]}-1; i>=0; i-- )); do
    p=${pids[i]}
    kill -TERM "$p" 2>/dev/null || continue
    for _ in $(seq 40); do kill -0 "$p" 2>/dev/null || break; sleep 0.25; done
    kill -KILL "$p" 2>/dev/null || true
    wait "$p" 2>/dev/null || true
  done
  rm -rf "$T"
  exit "$st"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

host=$(hostname -s 2>/dev/null || hostname)
[ -n "$host" ] || skip "no host name (hostname printed nothing)"
getent hosts "$host" >/dev/null 2>&1 \
  || skip "the host name '$host' does not resolve (getent hosts), so slurmd cannot reach slurmctld"

# two free TCP ports in a row, for slurmctld and slurmd (a system Slurm or
# another run of this test may hold the standard 6817 and 6818)
port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
ctld_port=
for _ in $(seq 30); do
  p=$(( 20000 + RANDOM % 30000 ))
  if port_free "$p" && port_free $((p + 1)); then ctld_port=$p; break; fi
done
[ -n "$ctld_port" ] || skip "found no two free TCP ports in 30 tries"
slurmd_port=$((ctld_port + 1))

# munge: a fresh key, its own socket
if command -v mungekey >/dev/null 2>&1; then
  mungekey --create --keyfile="$T/key/munge.key" >/dev/null 2>&1 || true
fi
[ -s "$T/key/munge.key" ] \
  || dd if=/dev/urandom of="$T/key/munge.key" bs=1024 count=1 status=none
chmod 600 "$T/key/munge.key"
sock=$T/sock/munge.sock
munged -F --socket="$sock" --key-file="$T/key/munge.key" \
  --pid-file="$T/key/munged.pid" --seed-file="$T/key/munged.seed" \
  --log-file="$T/log/munged.log" >"$T/log/munged.out.log" 2>&1 &
pids+=($!)
for _ in $(seq 40); do
  [ -S "$sock" ] && break; kill -0 "${pids[0]}" 2>/dev/null || break; sleep 0.25
done
if ! { [ -S "$sock" ] && munge -n -S "$sock" | unmunge -S "$sock" >/dev/null 2>&1; }; then
  tail -n 5 "$T/log/munged.out.log" "$T/log/munged.log" 2>/dev/null || true
  skip "munged did not start or does not answer on $sock within 10 s (its log above)"
fi

export SLURM_CONF=$T/slurm.conf
cat >"$SLURM_CONF" <<EOF
# written by scripts/check-slurm.sh: one node, the test's own files
ClusterName=bltest
SlurmctldHost=$host
SlurmctldPort=$ctld_port
SlurmdPort=$slurmd_port
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$sock
StateSaveLocation=$T/state
SlurmdSpoolDir=$T/spool
SlurmctldPidFile=$T/slurmctld.pid
SlurmdPidFile=$T/slurmd.pid
SlurmctldLogFile=$T/log/slurmctld.log
SlurmdLogFile=$T/log/slurmd.log
# no cgroups, no accounting (job states from squeue and the jobcomp file)
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/filetxt
JobCompLoc=$T/jobcomp.txt
MpiDefault=none
SwitchType=switch/none
# one CPU per task, so the two CPUs run two tasks at a time
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
SlurmdParameters=config_overrides
ReturnToService=2
KillWait=5
MailProg=/bin/true
NodeName=$host CPUs=2 State=UNKNOWN
PartitionName=bltest Nodes=$host Default=YES MaxTime=INFINITE State=UP
EOF

slurmctld -D -f "$SLURM_CONF" >"$T/log/slurmctld.out.log" 2>&1 &
pids+=($!)
up=
for _ in $(seq 60); do
  if scontrol ping 2>/dev/null | grep -q 'is UP'; then up=1; break; fi
  kill -0 "${pids[1]}" 2>/dev/null || break
  sleep 0.25
done
if [ -z "$up" ]; then
  tail -n 8 "$T/log/slurmctld.out.log" "$T/log/slurmctld.log" 2>/dev/null || true
  skip "slurmctld did not start or does not answer within 15 s (its log above)"
fi

slurmd -D -f "$SLURM_CONF" -N "$host" >"$T/log/slurmd.out.log" 2>&1 &
pids+=($!)
up=
for _ in $(seq 60); do
  if sinfo -h -n "$host" -o %T 2>/dev/null | grep -q '^idle'; then up=1; break; fi
  kill -0 "${pids[2]}" 2>/dev/null || break
  sleep 0.25
done
if [ -z "$up" ]; then
  tail -n 8 "$T/log/slurmd.out.log" "$T/log/slurmd.log" 2>/dev/null || true
  sinfo -N -l 2>&1 | tail -n 3 || true
  skip "slurmd did not start or its node '$host' is not idle within 15 s (logs above)"
fi
say "$(sinfo --version) up on node '$host' (ports $ctld_port, $slurmd_port) in $(( $(date +%s) - start )) s"

# ---- the README's job script and commands --------------------------------------
# block NAME: the ```sh block of the README's Sharding section that holds
# the line matching PATTERN
readme_block() {
  awk -v pat="$1" '
    /^## / { insec = ($0 ~ /^## Sharding and parallel runs/) }
    insec && /^```sh$/ { inblk = 1; blk = ""; next }
    inblk && /^```$/ { inblk = 0; if (blk ~ pat) { printf "%s", blk; exit } next }
    inblk { blk = blk $0 "\n" }' README.md
}
job_src=$(readme_block 'SBATCH --array=1-16')
submit_src=$(readme_block 'sbatch --chdir=')
merge_src=$(readme_block 'brakelight --merge results/')
[ -n "$job_src" ] || fail "README.md, Sharding and parallel runs: no sh block with the job script ('#SBATCH --array=1-16')"
[ -n "$submit_src" ] || fail "README.md, Sharding and parallel runs: no sh block with the submit command ('sbatch --chdir=...')"
[ -n "$merge_src" ] || fail "README.md, Sharding and parallel runs: no sh block with the merge command"

# adapt(TEXT, SCRIPT, TABLE): the shard count 16 made $N, the recipe made
# SCRIPT, its table dsdk-table made TABLE; fails when a pattern is gone
adapt() {
  local s=$1
  s=${s//--array=1-16/--array=1-$N}
  s=${s//'/16"'/"/$N\""}
  s=${s//-of-16./-of-$N.}
  s=${s//lua\/recipes\/sharded_scan.lua/$2}
  s=${s//dsdk-table/$3}
  printf '%s\n' "$s"
}

# prepare WORKDIR SCRIPT TABLE: a working directory that looks like the
# source tree to the README's commands (lua, tests, build linked), with
# job.sh and the submit and merge commands of the README
prepare() {
  local w=$1
  mkdir -p "$w"
  ln -s "$tree/lua" "$w/lua"; ln -s "$tree/tests" "$w/tests"
  ln -s "$tree/build" "$w/build"
  adapt "$job_src" "$2" "$3" >"$w/job.sh"
  adapt "$submit_src" "$2" "$3" >"$w/submit.sh"
  adapt "$merge_src" "$2" "$3" >"$w/merge.sh"
  grep -q -- "--shard \"\$SLURM_ARRAY_TASK_ID/$N\"" "$w/job.sh" \
    || fail "README job script: no --shard \"\$SLURM_ARRAY_TASK_ID/16\" to run with $N shards: $(grep brakelight "$w/job.sh")"
  grep -q -- "$2" "$w/job.sh" || fail "README job script does not run lua/recipes/sharded_scan.lua"
  grep -q -- "-of-$N\." "$w/merge.sh" || fail "README merge command has no shard-*-of-16 to make $N"
}

# submit WORKDIR ARRAY: the README's submit commands, run in WORKDIR, with
# --parsable --array=ARRAY added to its sbatch; prints the job id
submit() {
  local out
  # shellcheck disable=SC2317  # (sbatch is called by submit.sh)
  out=$( cd "$1" && \
         sbatch() { command sbatch --parsable --array="$ARRAY" "$@"; } && \
         export ARRAY="$2" && export -f sbatch && bash -e ./submit.sh ) \
    || fail "sbatch (README's submit command, --array=$2) failed: $out"
  out=${out##*$'\n'}; out=${out%%;*}
  [[ $out =~ ^[0-9]+$ ]] || fail "sbatch printed no job id: '$out'"
  echo "$out"
}

# wait_job JOB: until squeue no longer lists JOB (timeout WAIT_SECS)
wait_job() {
  local t0=$SECONDS
  while [ -n "$(squeue -h -j "$1" -o %i 2>/dev/null)" ]; do
    (( SECONDS - t0 < WAIT_SECS )) \
      || { squeue 2>&1 | tail -n 5; fail "job $1 still queued or running after $WAIT_SECS s"; }
    sleep 0.25
  done
}

# task_state JOB TASK: the state jobcomp/filetxt recorded (the file is
# written when a task ends; empty if it has no line yet)
task_state() {
  local i s
  for i in $(seq 20); do
    s=$(grep " ArrayJobId=$1 ArrayTaskId=$2 " "$T/jobcomp.txt" 2>/dev/null \
          | tail -n 1 | sed -n 's/.* JobState=\([A-Z_]*\) .*/\1/p')
    [ -n "$s" ] && { echo "$s"; return; }
    sleep 0.25
  done
}

# expect_states JOB STATE TASK...: every TASK of JOB ended in STATE
expect_states() {
  local j=$1 want=$2 t s; shift 2
  for t in "$@"; do
    s=$(task_state "$j" "$t")
    [ "$s" = "$want" ] || fail "job ${j}_$t ended as '${s:-no jobcomp record}', expected $want"
  done
}

# records FILE: the data rows of a CSV table (no comment lines, no header)
records() { grep -v '^#' "$1" | tail -n +2; }

# same_records REF GOT WHAT: the tables agree record for record
same_records() {
  [ -s "$2" ] || fail "$3: $2 was not written"
  if ! diff <(grep -v '^#' "$1") <(grep -v '^#' "$2") >"$T/diff.txt"; then
    head -n 10 "$T/diff.txt" >&2
    fail "$3: the merged table differs from the unsharded run (diff above)"
  fi
}

# ---- 1. the README's job array, merged, against an unsharded run -------------
w=$T/w1
prepare "$w" lua/recipes/sharded_scan.lua dsdk-table
t0=$(date +%s)
export BRAKELIGHT_SMALL=1        # the job inherits it (--export=ALL)
submitted=1
job=$(submit "$w" "1-$N")
wait_job "$job"
expect_states "$job" COMPLETED $(seq 1 $N)
for i in $(seq 1 $N); do
  [ -f "$w/logs/bl-table-$i.log" ] || fail "job $job: no log logs/bl-table-$i.log"
  [ -f "$w/results/dsdk-table.shard-$i-of-$N.csv" ] \
    || fail "job ${job}_$i wrote no results/dsdk-table.shard-$i-of-$N.csv"
done
( cd "$w" && PATH="$tree/build:$PATH" bash -e ./merge.sh ) >"$T/merge1.log" 2>&1 \
  || { cat "$T/merge1.log" >&2; fail "the README's merge command failed"; }
build/brakelight -q lua/recipes/sharded_scan.lua "$T/ref1" >/dev/null
unset BRAKELIGHT_SMALL
same_records "$T/ref1/dsdk-table.csv" "$w/results/dsdk-table.csv" "run 1 (README job array)"
n1=$(records "$w/results/dsdk-table.csv" | wc -l)
[ "$n1" -eq 24 ] || fail "run 1: $n1 records, expected 24 (8 points x 3 photon energies)"
say "run 1: README job array $job (--array=1-$N) of sharded_scan.lua (small), merged: $n1 records equal to the unsharded run ($(( $(date +%s) - t0 )) s)"

# ---- 2. one task cancelled mid-way, resubmitted alone ------------------------
w=$T/w2
prepare "$w" tests/slurm/slow_scan.lua slow-table
per=$(( 16 / N ))                    # points of each shard
shard2=$w/results/slow-table.shard-2-of-$N.csv
t0=$(date +%s)
export BL_SLOW_POINT_SECS=0.4    # 4 points of 0.4 s in each task
job=$(submit "$w" "1-$N")
# cancel task 2 once its first point is on disk
t1=$SECONDS
until [ -f "$shard2" ] && [ "$(records "$shard2" | wc -l)" -ge 1 ]; do
  (( SECONDS - t1 < 30 )) || fail "job ${job}_2 wrote no point within 30 s"
  sleep 0.1
done
scancel "${job}_2"
wait_job "$job"
expect_states "$job" CANCELLED 2
expect_states "$job" COMPLETED 1 3 4
kept=$(records "$shard2" | wc -l)
{ [ "$kept" -ge 1 ] && [ "$kept" -lt "$per" ]; } \
  || fail "task 2 cancelled mid-way kept $kept of its $per points (expected 1 to $((per - 1)))"
if ( cd "$w" && PATH="$tree/build:$PATH" bash -e ./merge.sh ) >"$T/merge2a.log" 2>&1; then
  fail "--merge accepted the shards with task 2 cancelled ($kept of $per points)"
fi
grep -q -i 'missing' "$T/merge2a.log" \
  || { cat "$T/merge2a.log" >&2; fail "--merge of the incomplete shards did not name a missing point"; }
job2=$(submit "$w" 2)
wait_job "$job2"
expect_states "$job2" COMPLETED 2
[ "$(records "$shard2" | wc -l)" -eq "$per" ] \
  || fail "after resubmitting task 2 its shard holds $(records "$shard2" | wc -l) of $per points"
( cd "$w" && PATH="$tree/build:$PATH" bash -e ./merge.sh ) >"$T/merge2.log" 2>&1 \
  || { cat "$T/merge2.log" >&2; fail "the merge after the resubmission failed"; }
got=$w/results/slow-table.csv
dups=$(records "$got" | cut -d, -f1-3 | sort | uniq -d)
[ -z "$dups" ] || fail "run 2: points twice in the merged table: $dups"
n2=$(records "$got" | cut -d, -f1-3 | sort -u | wc -l)
{ [ "$n2" -eq 16 ] && [ "$(records "$got" | wc -l)" -eq 16 ]; } \
  || fail "run 2: $n2 distinct points in $(records "$got" | wc -l) records, expected 16"
BL_SLOW_POINT_SECS=0 build/brakelight -q tests/slurm/slow_scan.lua "$T/ref2" >/dev/null
same_records "$T/ref2/slow-table.csv" "$got" "run 2 (task 2 cancelled and resubmitted)"
say "run 2: job $job, task 2 cancelled after $kept of $per points, resubmitted alone as job $job2 (--array=2): 16 points, each once, equal to the unsharded run ($(( $(date +%s) - t0 )) s)"
say "passed ($(( $(date +%s) - start )) s; a real slurmctld and slurmd, stopped now)"
