/* Start-up probe: main's return value must come back as QEMU's exit status (reset
 * handler -> exit(main()) -> newlib -> semihosting). Expected status: 3. */
int main(void) { return 3; }
