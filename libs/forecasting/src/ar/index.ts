export * from './yule-walker';
export * from './cmle';
