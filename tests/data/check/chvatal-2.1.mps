NAME          CHVATAL21
OBJSENSE
    MAX
ROWS
 N  obj
 L  c1
 L  c2
 L  c3
COLUMNS
    x1        obj       5              c1        2
    x1        c2        4              c3        3
    x2        obj       4              c1        3
    x2        c2        1              c3        4
    x3        obj       3              c1        1
    x3        c2        2              c3        2
RHS
    rhs       c1        5              c2        11
    rhs       c3        8
ENDATA
