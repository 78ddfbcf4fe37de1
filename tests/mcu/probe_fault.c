/* Fault probe: an undefined instruction must end the run through the fault handler
 * with status 70, not hang. */
int main(void) {
    __asm__ volatile(".short 0xde00"); /* UDF #0 (Thumb) */
    return 0;
}
