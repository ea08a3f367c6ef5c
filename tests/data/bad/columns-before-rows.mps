* invented model with one defect: COLUMNS comes before ROWS
NAME          INVENTED
COLUMNS
    X1        COST         1.0   LIM1         1.0
    X1        LIM2         1.0
    X2        COST         2.0   LIM1         1.0
ROWS
 N  COST
ENDATA
