* invented model with one defect: the file stops inside COLUMNS
NAME          INVENTED
ROWS
 N  COST
 L  LIM1
 G  LIM2
COLUMNS
    X1        COST         1.0   LIM1         1.0
    X1        LIM2         1.0
    X2        COST         2.0   LIM1         1.0
