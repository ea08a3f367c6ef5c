NAME          chvatal-integer
OBJSENSE
    MAX
ROWS
 N  profit
 L  r1
 L  r2
 L  r3
COLUMNS
    MARKER                 'MARKER'                 'INTORG'
    x1        profit    5              r1        2
    x1        r2        4              r3        3
    x2        profit    4              r1        3
    x2        r2        1              r3        4
    MARKER                 'MARKER'                 'INTEND'
    x3        profit    3              r1        1
    x3        r2        2              r3        2
RHS
    rhs       r1        5              r2        11
    rhs       r3        8
ENDATA
