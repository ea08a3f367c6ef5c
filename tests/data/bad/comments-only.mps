* invented file with one defect: nothing but comments
* no sections at all
