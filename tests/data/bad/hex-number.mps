* invented model with one defect: a range written in hexadecimal
NAME          INVENTED
ROWS
 N  COST
 L  LIM1
 G  LIM2
COLUMNS
    X1        COST         1.0   LIM1         1.0
    X1        LIM2         1.0
    X2        COST         2.0   LIM1         1.0
RHS
    RHS       LIM1         4.0   LIM2         1.0
RANGES
    RNG       LIM1         0x10
BOUNDS
 UP BND       X1           4.0
ENDATA
