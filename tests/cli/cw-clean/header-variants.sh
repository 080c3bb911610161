# Header recognition without -c: synonyms and unit suffixes, in the forms
# gauges and exports write them (see HEADER RECOGNITION in cw-clean(1)).
# Every log below holds the same sample, so every output row must be
#   EB-1,2026-03-01T00:00:00Z,3.812,-2.35,20,83
# (68 F = 20 C by F = C * 9/5 + 32; 293.15 K and 2931.5 dK = 20 C by
# K = C + 273.15; 3812 mV = 3.812 V; -2350 mA = -2.35 A; 0.83 = 83 %).
# source: hand
cd "$TMPDIR_CASE" || exit 1
one() {
	printf '%s\n%s\n' "$1" "$2" >log.csv
	printf '%-58s ' "$1"
	cw-clean log.csv | sed 1d
}
one 'device,time,voltage_v,current_a,temp_c,soc_pct' \
    'EB-1,2026-03-01T00:00:00Z,3.812,-2.35,20,83'
one 'pack_id,time_s,pack_mv,current_ma,temp_f,soc_frac' \
    'EB-1,1772323200,3812,-2350,68,0.83'
one 'Serial No,Timestamp (ms),Voltage (mV),Current (mA),Temp (°F),SoC (%)' \
    'EB-1,1772323200000,3812,-2350,68,83'
one 'Pack ID,Time (UTC),Voltage [V],Current [A],Temperature [0.1K],RSOC' \
    'EB-1,2026-03-01 00:00:00,3.812,-2.35,2931.5,83'
one 'battery,datetime,vbat,ibat,tbat_k,level' \
    'EB-1,2026-03-01T00:00:00Z,3.812,-2.35,293.15,83'
one 'DEVICE,TIMESTAMP,VOLTAGE,CURRENT,TEMPERATURE,SOC' \
    'EB-1,2026-03-01T00:00:00Z,3.812,-2.35,20,83'
one 'unit,epoch_us,volts,amps,cell temp,state of charge' \
    'EB-1,1772323200000000,3.812,-2.35,20,83'
