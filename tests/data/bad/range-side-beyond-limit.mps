* invented model with one defect: the range moves the row's upper side to 1.8e100000
NAME          INVENTED
ROWS
 N  COST
 E  LIM
COLUMNS
    X1        COST         1.0   LIM          1.0
RHS
    RHS       LIM          9e99999
RANGES
    RNG       LIM          9e99999
ENDATA
