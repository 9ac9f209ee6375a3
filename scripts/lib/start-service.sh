# Starting a local stand-in service (the mail catcher, the SMS fake) on a loopback port, once per
# checkout. Source it after env.sh; do not run it.
#
#   start_local_service <stem> <what> <port variable> <host> <port> <folder> -- <command …>
#
# <stem> names its files in .data/ (<stem>.pid, <stem>.port, <stem>.log); <what> is how messages call
# it ("mail catcher"); <port variable> is the setting a person changes when the port is taken
# (SMTP_PORT). If something already answers on the port it must be this checkout's own process
# (its pid alive and its port file matching), or the script stops: another checkout's service would
# swallow this one's messages and every test waiting for them would wait in vain.
start_local_service() {
  local stem="$1" what="$2" port_variable="$3" host="$4" port="$5" folder="$6"
  shift 6
  [ "${1:-}" = "--" ] && shift
  mkdir -p "$folder"
  local pid_file="$DATA_DIR/$stem.pid" port_file="$DATA_DIR/$stem.port" log_file="$DATA_DIR/$stem.log"
  _port_open() { node -e "const s=require('net').connect(+process.argv[1],process.argv[2]);s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))" "$port" "$host"; }
  if _port_open; then
    if [ -s "$pid_file" ] && kill -0 "$(cat "$pid_file")" 2>/dev/null && [ "$(cat "$port_file" 2>/dev/null)" = "$port" ]; then
      return 0
    fi
    echo "The $what port $host:$port is taken by another program (not this checkout's $what); stop it or set $port_variable to a free port" >&2
    return 1
  fi
  log "starting $what on $host:$port, writing to $folder"
  setsid nohup "$@" >"$log_file" 2>&1 < /dev/null &
  echo $! > "$pid_file"
  echo "$port" > "$port_file"
  for _ in $(seq 1 40); do
    _port_open && return 0
    sleep 0.25
  done
  echo "$what did not start; see $log_file" >&2
  return 1
}
