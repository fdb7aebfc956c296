// jstat ships no type declarations; the tests use it as an untyped reference library.
declare module 'jstat';
