-- placeholder; replaced by the store work
SELECT 1;
