* Terminal 7 summer regular blend, one day's batch: the model of summer-blend.plumb in free MPS.
* INVENTED DATA for illustration only. Plain statements for these terse names are in
* summer-blend.labels.csv, which plumb reads automatically when it sits beside this file.
* plumb verifies the mathematics of the model as written; whether the model captures the law or
* the specification is for qualified people under local codes.
NAME SUMMER7
ROWS
 N COST
 E BATCH
 E ETHSHR
 G OCTANE
 L RVP
 L BENZ
COLUMNS
 BUT COST 42 BATCH 1
 BUT ETHSHR -0.1 OCTANE 5
 BUT RVP 52
 LSR COST 61 BATCH 1
 LSR ETHSHR -0.1 OCTANE -19
 LSR RVP 11.5 BENZ 1.1
 REF COST 86 BATCH 1
 REF ETHSHR -0.1 OCTANE 7
 REF RVP 3.2 BENZ 1.2
 ALK COST 95 BATCH 1
 ALK ETHSHR -0.1 OCTANE 7
 ALK RVP 4.6
 ETH COST 78 BATCH 1
 ETH ETHSHR 0.9 OCTANE 26
 ETH RVP 18
RHS
 RHS BATCH 12000 RVP 108000
 RHS BENZ 12000
BOUNDS
 UP BND BUT 900
 UP BND LSR 4000
 UP BND REF 5000
 UP BND ALK 3000
 UP BND ETH 1500
ENDATA
